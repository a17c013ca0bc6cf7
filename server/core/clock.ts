/** Where services get the time, so tests can move it forward instead of waiting. */
export interface Clock {
  now(): Date;
}

export const systemClock: Clock = { now: () => new Date() };
