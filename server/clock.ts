/** Time as a dependency: the server reads the clock only through this, so tests pass a fake. */
export interface Clock {
  now(): Date;
}

/** The real wall clock. */
export const systemClock: Clock = { now: () => new Date() };
