/** Time as a dependency, so tests can move it (session expiry, token expiry, reminders). */
export type Clock = { now(): number };

export const systemClock: Clock = { now: () => Date.now() };

export function fixedClock(start: number): Clock & { advance(ms: number): void; set(ms: number): void } {
  let t = start;
  return { now: () => t, advance: (ms) => { t += ms; }, set: (ms) => { t = ms; } };
}
