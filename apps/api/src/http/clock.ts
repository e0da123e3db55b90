/** Time comes from here so tests can move it (session expiry, invitation links). */
export interface Clock {
  now(): Date;
}
export const systemClock: Clock = { now: () => new Date() };
