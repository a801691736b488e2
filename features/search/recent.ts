// Recent searches, kept on this device (localStorage) so the tech at the car can repeat one with a tap.
const KEY = 'causeway.search.recent';
const MAX = 8;

function store(): Storage | null {
  try {
    return typeof globalThis.localStorage === 'undefined' ? null : globalThis.localStorage;
  } catch {
    return null;
  }
}

export function readRecent(): string[] {
  try {
    const raw = store()?.getItem(KEY);
    const list: unknown = raw ? JSON.parse(raw) : [];
    return Array.isArray(list) ? list.filter((x): x is string => typeof x === 'string').slice(0, MAX) : [];
  } catch {
    return [];
  }
}

/** Puts a query first, without repeats; returns the new list. */
export function rememberSearch(q: string): string[] {
  const text = q.trim().slice(0, 200);
  if (!text) return readRecent();
  const next = [text, ...readRecent().filter((x) => x.toLowerCase() !== text.toLowerCase())].slice(0, MAX);
  try {
    store()?.setItem(KEY, JSON.stringify(next));
  } catch {
    // private mode or full storage: recent searches are a convenience
  }
  return next;
}

export function clearRecent(): string[] {
  try {
    store()?.removeItem(KEY);
  } catch {
    // nothing to clear
  }
  return [];
}
