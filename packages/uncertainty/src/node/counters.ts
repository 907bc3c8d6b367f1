/**
 * Counters of the pool's interval routes, for the tests (not exported by the package): a fixed
 * run's coverage intervals come from the tails the workers sorted, or — when those could not be
 * collected — from the values on the main thread.
 */
export const intervalRoutes = {
  /** Intervals read from the workers' combined sorted tails. */
  fromWorkers: 0,
  /** Intervals computed on the main thread from the values. */
  onMainThread: 0,
};
