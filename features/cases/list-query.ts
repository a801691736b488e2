// Case-list filters live in the URL query so a link reproduces the view. Pure: unit-tested.

export const FILTER_KEYS = ['status', 'platformId', 'code', 'tag', 'confirmed', 'mine', 'sort', 'dir', 'page'] as const;
export type FilterKey = (typeof FILTER_KEYS)[number];
export type ListFilters = Partial<Record<FilterKey, string>>;
export type SortKey = 'updated' | 'title' | 'platform' | 'codes' | 'status' | 'confirmed';

/** Only known keys with a value; expo-router hands params as string | string[]. */
export function filtersFromParams(params: Record<string, string | string[] | undefined>): ListFilters {
  const out: ListFilters = {};
  for (const key of FILTER_KEYS) {
    const raw = params[key];
    const value = (Array.isArray(raw) ? raw[0] : raw)?.trim();
    if (value) out[key] = value;
  }
  return out;
}

export function toQueryString(filters: ListFilters, pageSize?: number): string {
  const q = new URLSearchParams();
  for (const key of FILTER_KEYS) {
    const value = filters[key];
    if (value) q.set(key, value);
  }
  if (pageSize) q.set('pageSize', String(pageSize));
  return q.toString();
}

/** Pressing a column header: the same column flips direction, a new column starts descending (newest, most first). */
export function toggleSort(filters: ListFilters, key: SortKey): ListFilters {
  const current = (filters.sort ?? 'updated') as SortKey;
  const dir = filters.dir ?? 'desc';
  const nextDir = current === key ? (dir === 'desc' ? 'asc' : 'desc') : key === 'title' || key === 'platform' ? 'asc' : 'desc';
  return { ...filters, sort: key, dir: nextDir, page: undefined };
}

/** Any filter change goes back to page 1. */
export function withFilter(filters: ListFilters, key: FilterKey, value: string | undefined): ListFilters {
  return { ...filters, [key]: value || undefined, ...(key === 'page' ? {} : { page: undefined }) };
}

export function activeFilterCount(filters: ListFilters): number {
  return (['status', 'platformId', 'code', 'tag', 'confirmed', 'mine'] as const).filter((k) => filters[k]).length;
}

export const pageCount = (total: number, pageSize: number) => Math.max(1, Math.ceil(total / pageSize));
