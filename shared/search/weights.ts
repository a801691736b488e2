// Every number the ranking uses, in one place. docs/search.md explains the
// reasoning; these are judgement calls (common practice, no source), meant to
// be tuned against real shop searches.
//
// Score = relevance x quality.
// Relevance is a sum of match points (what the case has in common with the
// query). Quality multiplies it (fix confirmed, reviewed status, recency), so
// a confirmed fix lifts a relevant case but never drags an unrelated one up.

export const SEARCH_WEIGHTS = {
  /** Points for codes, times the mean match strength over the query's codes (typed and implied). */
  code: {
    points: 40,
    /** strength of the best match for one query code */
    exact: 1,
    family: 0.5, // P0302 vs P0301/P0300: same first four characters
    group: 0.2, // P0302 vs P0351: same system group (ignition system or misfire)
  },
  /** Cylinders named without misfire (e.g. "low compression cyl 3"): share of them the case's codes name. */
  cylinder: 12,
  /** Misfire pattern by bank, on each case's own platform. */
  bank: {
    bothBanks: 8, // both banks misfiring points at something common to the engine
    sameBank: 4, // one bank only: that bank's cam timing, intake, fuel feed
  },
  /** Share of the query's symptom tags the case carries. */
  symptom: 20,
  /** Share of the query's recent-work tags the case carries. */
  context: 15,
  /** Platform of the case against the platform the query is about. */
  platform: {
    'same-engine': 20,
    'same-model': 12,
    'same-layout': 6,
    none: 0,
  },
  /** Text relevance from the index (0..1). */
  text: 15,
  /** Quality multipliers. */
  fixConfirmed: 1.25,
  status: { published: 1, review: 0.95, draft: 0.9 } as Record<string, number>,
  recency: {
    /** the recency part halves every this many days */
    halfLifeDays: 730,
    /** an old case keeps this share of its score */
    floor: 0.8,
    /** say "updated N days ago" up to this age */
    mentionWithinDays: 60,
  },
} as const;

export type SearchWeights = typeof SEARCH_WEIGHTS;
