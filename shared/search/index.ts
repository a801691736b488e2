export * from './query';
export * from './rank';
export * from './weights';
export * from './keys';
export { CONTEXT_TAGS, CONTEXT_LABELS, type ContextTag } from './context';
export { MAX_QUERY_CHARS } from './text';
export { queryText, queryWithout, removableChips, type RemovableChip } from './rewrite';
