/** Durations as people read them: print time, hand work, lead times. */

/**
 * A duration from minutes, rounded to the minute: `45 min`, `3 h 05 min`.
 * @param minutes - duration in minutes
 */
export function formatMinutes(minutes: number): string {
  const whole = Math.max(0, Math.round(minutes));
  const hours = Math.floor(whole / 60);
  return hours > 0 ? `${hours} h ${String(whole % 60).padStart(2, '0')} min` : `${whole} min`;
}

/**
 * A duration from minutes in hours with one decimal, for charts and plate lists: `3.1 h`.
 * @param minutes - duration in minutes
 */
export function formatHours(minutes: number): string {
  return `${(minutes / 60).toFixed(1)} h`;
}
