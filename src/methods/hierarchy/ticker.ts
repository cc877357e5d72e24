// Progress for long agglomerations: the algorithms call `tick(mergesDone)` once per merge and the
// ticker reports about a hundred times in all, so the callback costs nothing measurable.
import { ProgressCallback, report } from '../../core/progress';

export type MergeTick = (done: number) => void;

export function mergeTicker(callback: ProgressCallback | undefined, n: number, method: string): MergeTick | undefined {
  if (callback === undefined) return undefined;
  const total = n - 1;
  const step = Math.max(1, Math.ceil(total / 100));
  let next = 0;
  return (done) => {
    if (done < next && done !== total) return;
    next = done + step;
    report(callback, { task: 'agglomerating', done, total, detail: `${method} linkage` });
  };
}
