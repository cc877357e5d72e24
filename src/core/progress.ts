// Long work reports through a callback; the notebook layer turns it into a display that
// overwrites itself. The core prints nothing.

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
