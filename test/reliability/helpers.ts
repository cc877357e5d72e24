// Shared helpers of the reliability suite.
import { expect } from 'vitest';
import { KinsortError } from '../../src/core/errors';

/** Runs `f`, expects a KinsortError (never a TypeError / RangeError), and checks the message. */
export function refusal(f: () => unknown, ...mustMention: (string | RegExp)[]): KinsortError {
  let caught: unknown;
  try {
    f();
  } catch (e) {
    caught = e;
  }
  expect(caught, 'expected a refusal').toBeDefined();
  if (!(caught instanceof KinsortError)) throw new Error(`expected a KinsortError, got ${String((caught as Error)?.stack ?? caught)}`);
  for (const m of mustMention) {
    if (typeof m === 'string') expect(caught.message).toContain(m);
    else expect(caught.message).toMatch(m);
  }
  return caught;
}

/** Only KinsortError may escape `f`; returns whether it threw. */
export function onlyKinsortErrors(f: () => unknown): boolean {
  try {
    f();
    return false;
  } catch (e) {
    if (e instanceof KinsortError) return true;
    throw e;
  }
}
