// Every order transition and deadline asks a Clock for the time, so tests can move time instead of sleeping.
export interface Clock {
  now(): Date;
}

export const systemClock: Clock = { now: () => new Date() };
