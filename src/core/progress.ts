// Long work reports through a callback; the notebook layer turns it into a display that
// overwrites itself. The core prints nothing.
import { KinsortError } from './errors';

export interface ProgressEvent {
  /** What is running, in words: "k-means restarts", "gap reference sets", … */
  readonly task: string;
  /** Units finished so far (0..total). */
  readonly done: number;
  /** Units in all. */
  readonly total: number;
  /** Optional short detail, e.g. "k = 4". */
  readonly detail?: string;
}

export type ProgressCallback = (event: ProgressEvent) => void;

/** Call `callback` if given; a throwing callback must not break the computation's state. */
export function report(callback: ProgressCallback | undefined, event: ProgressEvent): void {
  if (callback) callback(event);
}

/** Reports `done` of a fixed `total`, about a hundred times in all (and always at the end). */
export type Ticker = (done: number) => void;

/**
 * A ticker for a loop of `total` units, or undefined without a callback (the loop then skips
 * even the call). Reporting about a hundred times keeps the callback's cost unmeasurable.
 */
export function progressTicker(callback: ProgressCallback | undefined, task: string, total: number, detail?: string): Ticker | undefined {
  if (callback === undefined) return undefined;
  const step = Math.max(1, Math.ceil(total / 100));
  let next = 0;
  return (done) => {
    if (done < next && done !== total) return;
    next = done + step;
    callback(detail === undefined ? { task, done, total } : { task, done, total, detail });
  };
}

/** Refuse an `onProgress` that is not a function, naming the call. */
export function checkProgress(value: unknown, where: string): ProgressCallback | undefined {
  if (value === undefined) return undefined;
  if (typeof value !== 'function') {
    throw new KinsortError(`${where}: option onProgress must be a function (event) => void; got ${typeof value}.`, 'bad-option');
  }
  return value as ProgressCallback;
}
