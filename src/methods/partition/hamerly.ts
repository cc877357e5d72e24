// Lloyd's k-means iterations accelerated with Hamerly's bounds: centre update, then the
// bookkeeping the bounds need (each centre's move, the largest two moves, half the gap from
// each centre to its nearest other), then one sweep (hamerly-sweep.ts); until the centres stop
// moving or the cap is reached.
//
// References:
//   S. P. Lloyd, "Least squares quantization in PCM", IEEE Transactions on Information Theory
//   28(2), 129–137 (1982), doi:10.1109/TIT.1982.1056489.
//   G. Hamerly, "Making k-means even faster", Proceedings of the 2010 SIAM International
//   Conference on Data Mining, 130–140, doi:10.1137/1.9781611972801.12.
import { centresFromSums, repairEmpty } from './centre-update';
import { firstAssignment, hamerlySweep, type StartFrom } from './hamerly-sweep';
import { interleaveInPairs, PARAM_MOST, PARAM_MOST_AT, PARAM_SECOND_MOST, type KmeansMemory } from './kmeans-memory';
import { withinOn } from './within-ss';

export interface LloydRun {
  /** Centre updates made. */
  iterations: number;
  /** True when the centres stopped moving (within tolerance) before maxIterations. */
  converged: boolean;
  /** Within-SS after each centre update, when asked for (tests only). */
  trace?: number[];
}

/**
 * Run Lloyd iterations from the centres in `mem.centres` (overwritten with the final ones): the
 * first assignment and bounds as `from` says (hamerly-sweep.ts). The assignment is left in `mem.assignment`. Stops when
 * the summed squared centre movement is at most `tolerance` (an absolute value; the caller
 * scales it), or after `maxIterations` updates.
 */
export function runHamerly(mem: KmeansMemory, maxIterations: number, tolerance: number, trace: boolean, from: StartFrom): LloydRun {
  const { d, k } = mem.layout;
  const { centres, previous, moved, halfGap, params } = mem;
  const traceValues: number[] | undefined = trace ? [] : undefined;
  firstAssignment(mem, from);

  let iterations = 0;
  let converged = false;
  for (;;) {
    // Centres to the means of their rows; how far each moved (from before any repair, so a
    // repaired centre's jump is counted in the bounds too).
    previous.set(centres);
    repairEmpty(mem);
    const shift = centresFromSums(mem, moved);
    iterations++;
    if (traceValues) traceValues.push(withinOn(mem));
    if (shift <= tolerance) converged = true;
    // Nothing moved: the assignment is already nearest-centre for these centres.
    if (shift === 0) break;
    const last = converged || iterations >= maxIterations;

    // The largest and second-largest moves, for the lower bounds in the sweep.
    let most = 0;
    let mostAt = -1;
    let secondMost = 0;
    for (let c = 0; c < k; c++) {
      const m = moved[c];
      if (m > most) {
        secondMost = most;
        most = m;
        mostAt = c;
      } else if (m > secondMost) {
        secondMost = m;
      }
    }
    params[PARAM_MOST] = most;
    params[PARAM_SECOND_MOST] = secondMost;
    params[PARAM_MOST_AT] = mostAt;

    // Half the distance from each centre to its nearest other centre.
    for (let c = 0; c < k; c++) halfGap[c] = Infinity;
    for (let c = 0; c < k; c++) {
      const cb = c * d;
      for (let e = c + 1; e < k; e++) {
        const eb = e * d;
        let s = 0;
        for (let j = 0; j < d; j++) {
          const diff = centres[cb + j] - centres[eb + j];
          s += diff * diff;
        }
        const h = 0.5 * Math.sqrt(s);
        if (h < halfGap[c]) halfGap[c] = h;
        if (h < halfGap[e]) halfGap[e] = h;
      }
    }

    // After the last centre update the sweep runs once more, so the result is nearest-centre
    // for the final centres.
    if (mem.pairScan) interleaveInPairs(mem.paddedCentres, mem.centresPaired, mem.paddedCentres.length / d, d);
    hamerlySweep(mem);
    if (last) break;
  }
  return { iterations, converged, trace: traceValues };
}
