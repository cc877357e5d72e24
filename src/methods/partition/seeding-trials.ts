// How many candidates k-means++ weighs for each new centre (the memory layout sizes its trial
// arrays by it, the seeding draws that many).

/**
 * Greedy trials per new centre: 2 + floor(ln k), the choice of Arthur & Vassilvitskii's greedy
 * variant as scikit-learn applies it (common practice).
 */
export function defaultTrials(k: number): number {
  return 2 + Math.floor(Math.log(k));
}
