// The one seeded generator of the package: xoshiro128** (Blackman & Vigna 2018), seeded through
// splitmix32. Only 32-bit integer arithmetic (Math.imul, >>>), so the same seed gives the same
// stream on every machine and every JavaScript engine.
import { KinsortError } from './core/errors';

/** A seed: a safe integer or any string (hashed). */
export type Seed = number | string;

export interface Random {
  /** Uniform double in [0, 1) with 53 random bits. */
  next(): number;
  /** Uniform 32-bit unsigned integer. */
  uint32(): number;
  /** Uniform integer in [0, n), unbiased (rejection sampling). */
  int(n: number): number;
  /** Uniform double in [low, high). */
  uniform(low: number, high: number): number;
  /** Standard normal deviate (Marsaglia polar method). */
  normal(): number;
  /** Fisher–Yates shuffle in place; returns the array. */
  shuffle<T extends { length: number; [i: number]: any }>(values: T): T;
  /** A new generator whose stream depends on this one's seed and `stream`, not on how far this one has run. */
  fork(stream: number | string): Random;
  /** The seed words this generator started from (for reports and definition files). */
  readonly seedWords: readonly number[];
}

const DEFAULT_SEED = 0x6b696e73; // any fixed value: "kins"

/** Hash a string to 32 bits (FNV-1a), used to turn string seeds and stream names into numbers. */
function hashString(text: string): number {
  let h = 0x811c9dc5;
  for (let i = 0; i < text.length; i++) {
    h ^= text.charCodeAt(i);
    h = Math.imul(h, 0x01000193);
  }
  return h >>> 0;
}

function seedToWords(seed: Seed | undefined): [number, number] {
  if (seed === undefined) return [DEFAULT_SEED, 0];
  if (typeof seed === 'string') return [hashString(seed), hashString('#' + seed)];
  if (typeof seed !== 'number' || !Number.isSafeInteger(seed)) {
    throw new KinsortError(`seed must be a whole number (or a string); got ${String(seed)}.`, 'bad-seed');
  }
  const negative = seed < 0 ? 1 : 0;
  const magnitude = Math.abs(seed);
  const lo = magnitude % 0x100000000;
  const hi = Math.floor(magnitude / 0x100000000) ^ (negative << 31);
  return [lo >>> 0, hi >>> 0];
}

/** splitmix32 step: spreads a 32-bit state into well-mixed words for the xoshiro state. */
function splitmix32(state: { s: number }): number {
  state.s = (state.s + 0x9e3779b9) | 0;
  let z = state.s;
  z = Math.imul(z ^ (z >>> 16), 0x85ebca6b);
  z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35);
  return (z ^ (z >>> 16)) >>> 0;
}

class Xoshiro128 implements Random {
  private a: number;
  private b: number;
  private c: number;
  private d: number;
  private spareNormal: number | null = null;
  readonly seedWords: readonly number[];

  constructor(words: readonly number[], state?: readonly number[]) {
    this.seedWords = words.slice();
    if (state) {
      [this.a, this.b, this.c, this.d] = state.map((x) => x | 0);
      return;
    }
    const mix = { s: words[0] ^ Math.imul(words[1] | 0, 0x2545f491) };
    this.a = splitmix32(mix);
    this.b = splitmix32(mix);
    this.c = splitmix32(mix);
    this.d = splitmix32(mix);
    if ((this.a | this.b | this.c | this.d) === 0) this.a = 1; // the all-zero state is a fixed point
  }

  uint32(): number {
    const result = Math.imul(rotl(Math.imul(this.b, 5), 7), 9) >>> 0;
    const t = this.b << 9;
    this.c ^= this.a;
    this.d ^= this.b;
    this.b ^= this.c;
    this.a ^= this.d;
    this.c ^= t;
    this.d = rotl(this.d, 11);
    return result;
  }

  next(): number {
    const high = this.uint32() >>> 5; // 27 bits
    const low = this.uint32() >>> 6; // 26 bits
    return (high * 67108864 + low) / 9007199254740992;
  }

  int(n: number): number {
    if (!Number.isInteger(n) || n <= 0 || n > 0x100000000) {
      throw new KinsortError(`int(n) needs a whole n in 1..2^32; got ${n}.`, 'bad-argument');
    }
    if (n === 1) return 0;
    // Rejection keeps every value equally likely.
    const limit = 0x100000000 - (0x100000000 % n);
    let x = this.uint32();
    while (x >= limit) x = this.uint32();
    return x % n;
  }

  uniform(low: number, high: number): number {
    return low + (high - low) * this.next();
  }

  normal(): number {
    if (this.spareNormal !== null) {
      const v = this.spareNormal;
      this.spareNormal = null;
      return v;
    }
    let u: number, v: number, s: number;
    do {
      u = 2 * this.next() - 1;
      v = 2 * this.next() - 1;
      s = u * u + v * v;
    } while (s >= 1 || s === 0);
    const f = Math.sqrt((-2 * Math.log(s)) / s);
    this.spareNormal = v * f;
    return u * f;
  }

  shuffle<T extends { length: number; [i: number]: any }>(values: T): T {
    for (let i = values.length - 1; i > 0; i--) {
      const j = this.int(i + 1);
      const tmp = values[i];
      values[i] = values[j];
      values[j] = tmp;
    }
    return values;
  }

  fork(stream: number | string): Random {
    const tag = typeof stream === 'string' ? hashString(stream) : stream >>> 0;
    const w0 = (this.seedWords[0] ^ Math.imul(tag ^ 0x68e31da4, 0x9e3779b1)) >>> 0;
    const w1 = (this.seedWords[1] + Math.imul(tag, 0x85ebca77) + 0x27d4eb2f) >>> 0;
    return new Xoshiro128([w0, w1]);
  }
}

function rotl(x: number, k: number): number {
  return (x << k) | (x >>> (32 - k));
}

/** The package's seeded generator. The same seed gives the same stream everywhere. */
export function createRandom(seed?: Seed): Random {
  return new Xoshiro128(seedToWords(seed));
}

/** @internal A generator started from a raw xoshiro128** state, for checking against published test vectors. */
export function xoshiro128FromState(state: readonly [number, number, number, number]): Random {
  return new Xoshiro128([0, 0], state);
}
