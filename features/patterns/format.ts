/** 0.7586 -> "76%"; no denominator -> an en dash with words beside it on screen. */
export const percent = (r: number | null) => (r === null ? '–' : `${Math.round(r * 100)}%`);

export const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;

/** '2026-11-30' -> '30 Nov'. */
export function shortDay(day: string): string {
  const months = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];
  return `${Number(day.slice(8, 10))} ${months[Number(day.slice(5, 7)) - 1] ?? ''}`;
}

export function longDay(day: string): string {
  return `${shortDay(day)} ${day.slice(0, 4)}`;
}
