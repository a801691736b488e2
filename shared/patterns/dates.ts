// Calendar-day arithmetic on 'YYYY-MM-DD' strings, in UTC so no time zone moves a day.
const DAY_MS = 86_400_000;

const toUtc = (day: string) => Date.UTC(Number(day.slice(0, 4)), Number(day.slice(5, 7)) - 1, Number(day.slice(8, 10)));

export const dayOf = (d: Date) => d.toISOString().slice(0, 10);

/** Whole calendar days from a to b (b later gives a positive number). */
export const daysBetween = (a: string, b: string) => Math.round((toUtc(b) - toUtc(a)) / DAY_MS);

export const addDays = (day: string, n: number) => dayOf(new Date(toUtc(day) + n * DAY_MS));

/** The Monday that starts the ISO week holding this day. */
export function weekStart(day: string): string {
  const weekday = (new Date(toUtc(day)).getUTCDay() + 6) % 7; // Monday 0 .. Sunday 6
  return addDays(day, -weekday);
}

/** ISO 8601 week id such as '2026-W49' (the week's Thursday decides the year). */
export function isoWeekKey(day: string): string {
  const thursday = addDays(weekStart(day), 3);
  const year = thursday.slice(0, 4);
  const week = Math.floor(daysBetween(`${year}-01-01`, thursday) / 7) + 1;
  return `${year}-W${String(week).padStart(2, '0')}`;
}

/** Every week start from the week of `from` to the week of `to`, in order. */
export function weeksIn(from: string, to: string): string[] {
  const weeks: string[] = [];
  for (let w = weekStart(from); w <= to; w = addDays(w, 7)) weeks.push(w);
  return weeks;
}

/** The default dashboard period: the 90 calendar days ending today, both ends included. */
export function defaultPeriod(today: string, days = 90): { from: string; to: string } {
  return { from: addDays(today, -(days - 1)), to: today };
}
