/**
 * Safety cautions for walk steps: the tree's own caution, plus the situational
 * ones a tree author cannot know in advance (a hybrid's high voltage, exhaust
 * fumes in a closed bay, a road test), worded once and deferring once.
 *
 * Trees write their cautions in plain words, optionally opening with "Caution:"
 * and ending with their own "Follow the manufacturer's procedure." Both are
 * stripped here and the single standard deferral is added at the end, so the
 * screen and the write-up never say "Caution: Caution:" or defer twice.
 */
import type { WalkEvidence } from './evidence';
import { listCauses, type Tree } from './tree-schema';

/** The one deferral every caution ends with. */
export const DEFERRAL = "Follow the manufacturer's procedure, local regulations and licensed practice.";

const LEADING_CAUTION = /^\s*(?:caution\s*:\s*)+/i;
/** A deferral an author wrote at the end (with or without "and tools", "timing procedure", ...). */
const TRAILING_DEFERRAL = /[,;]?\s*(?:and\s+)?follow\s+the\s+manufacturer['’]s\b[^.]*\.?\s*$/i;

/** The caution's own words: no leading "Caution:", no trailing deferral, one line. */
export function cautionBody(text: string): string {
  let body = text.replace(/\s+/g, ' ').replace(LEADING_CAUTION, '');
  while (TRAILING_DEFERRAL.test(body)) body = body.replace(TRAILING_DEFERRAL, '');
  body = body.trim();
  if (body && !/[.!?]$/.test(body)) body += '.';
  return body;
}

/** Several cautions as one text: each body once, in order, then the deferral once. Null when none. */
export function composeCaution(parts: readonly (string | undefined)[]): string | null {
  const bodies = [...new Set(parts.filter((p): p is string => !!p).map(cautionBody).filter(Boolean))];
  return bodies.length ? `${bodies.join(' ')} ${DEFERRAL}` : null;
}

export const HYBRID_CAUTION =
  'Hybrid high voltage: the orange cables and the parts they feed carry dangerous voltage, and in ready mode the engine can start by itself at any moment. Switch the system off and keep the key away from the car unless the step needs it running; only staff trained for high-voltage work may touch the high-voltage system.';
export const EXHAUST_CAUTION =
  'Running engine: exhaust gas contains carbon monoxide. Run the engine only outdoors or with an exhaust extraction hose fitted, never in a closed bay.';
export const ROAD_TEST_CAUTION =
  'Road test: the driver drives and a second person reads the scan tool; obey traffic law and speed limits, and test only where it is safe to do so.';

/** Test text that means the engine runs during the step. */
const RUNNING_ENGINE =
  /\b(?:idl(?:e|ing)|engine running|with the engine run|run the engine|start the engine|rev(?:s|ving)?|\d[,\d]* rpm|under load)\b/i;
/** Test text that means the car is driven on the road. */
const ROAD_TEST = /\broad\b|\btest drive\b|\bdrive the car\b|\bon the road\b/i;

export interface StepSafetyFacts {
  test: { do: string };
  caution?: string;
}

/** Which situational cautions apply to one step on this platform, before the tree's own caution is added. */
export function situationalCautions(step: StepSafetyFacts, ev: Pick<WalkEvidence, 'platform'>): string[] {
  const out: string[] = [];
  if (ev.platform?.fuel === 'hybrid') out.push(HYBRID_CAUTION);
  if (RUNNING_ENGINE.test(step.test.do)) out.push(EXHAUST_CAUTION);
  if (ROAD_TEST.test(step.test.do)) out.push(ROAD_TEST_CAUTION);
  return out;
}

/** The caution a step shows: situational cautions first (they are the bigger dangers), then the tree's. */
export function stepCaution(step: StepSafetyFacts, ev: Pick<WalkEvidence, 'platform'>): string | null {
  return composeCaution([...situationalCautions(step, ev), step.caution]);
}

const comparable = (text: string) => cautionBody(text).toLowerCase().replace(/[’']/g, "'").replace(/\s+/g, ' ');

/**
 * Problems for a shop's edit of a shipped tree that drops or cuts a shipped
 * caution: each cause still in the edit must keep its shipped caution's words
 * (a shop may add to a caution, never take from it). Empty when all are kept.
 */
export function removedCautions(shipped: Tree, edited: Tree): string[] {
  const editedById = new Map(listCauses(edited).map((c) => [c.id, c]));
  return listCauses(shipped).flatMap((cause) => {
    const kept = editedById.get(cause.id);
    if (!cause.caution || !kept) return [];
    if (kept.caution && comparable(kept.caution).includes(comparable(cause.caution))) return [];
    return [`branches: cause "${cause.id}" must keep its shipped caution ("${cautionBody(cause.caution).slice(0, 60)}..."); you may add to a caution but not remove or shorten it`];
  });
}
