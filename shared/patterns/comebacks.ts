// Comeback detection over one shop's visits. A comeback is a later visit of the same vehicle
// with the same fault (same code, or the same system) inside the shop's window after a visit
// whose fix was confirmed.
//
// "Within" at the edges, precisely:
// - days  = calendar days between the two visit days (visitDate, else the day the case was
//   written). 0 <= days <= N counts; day N counts, day N + 1 does not (N = shop.comebackDays).
// - km    = later odometer minus earlier odometer, each converted to km (1 mi = 1.609344 km).
//   Checked only when both visits carry a mileage and the later reading is not lower (a lower
//   reading is a typo or a new cluster, so it tells nothing). km <= M counts, M + 1 does not.
// - Both must hold: a car back on day 40 after 3,400 km with M = 3,000 is not a comeback.
// - The earlier case needs a confirmed fix; an unconfirmed first fix never makes a comeback.
// - Each later visit links to the most recent earlier visit that qualifies (one "comeback-of").
import { classifyDtc, parseDtc } from '../codes';
import { daysBetween } from './dates';

/** One visit as the pattern logic sees it; drafts and deleted cases are left out by the caller. */
export interface Visit {
  id: number;
  vehicleId: number | null;
  /** Visit day 'YYYY-MM-DD'. */
  day: string;
  mileage: number | null;
  mileageUnit: 'km' | 'mi' | null;
  codes: string[];
  symptoms: string[];
  /** Cause-tree id 'tree/cause', or null. */
  cause: string | null;
  confirmed: boolean;
}

export interface ComebackWindow {
  days: number;
  km: number;
}

export type LinkKind = 'same-code' | 'same-code-group' | 'same-cause-system' | 'same-symptom';

export interface FaultLink {
  kind: LinkKind;
  /** The code, group label, tree id or tag that links the two visits. */
  on: string;
  reason: string;
}

export interface ComebackPair {
  firstId: number;
  repeatId: number;
  vehicleId: number;
  days: number;
  /** Distance between the visits in km, or null when mileage is not known on both. */
  km: number | null;
  link: FaultLink;
}

/** International mile, exact by definition (1 mi = 1609.344 m; NIST SP 811 B.8, from memory). */
export const KM_PER_MILE = 1.609344;

export const DEFAULT_WINDOW: ComebackWindow = { days: 90, km: 3000 };

/** Tags that say "something is wrong" without naming a system; sharing one links nothing. */
const GENERIC_TAGS = new Set(['mil-on', 'flashing-mil', 'intermittent', 'warning-lights-multiple', 'warning-lights-all-on', 'limp-mode', 'low-power']);

export const toKm = (mileage: number, unit: 'km' | 'mi' | null) => (unit === 'mi' ? mileage * KM_PER_MILE : mileage);

/** km between two visits, or null when either reading is missing or the later one is lower. */
export function distanceKm(a: Visit, b: Visit): number | null {
  if (a.mileage === null || b.mileage === null) return null;
  // Rounded to a metre so 1,864.11 mi does not land a float hair beyond 3,000 km.
  const km = Math.round((toKm(b.mileage, b.mileageUnit) - toKm(a.mileage, a.mileageUnit)) * 1000) / 1000;
  return km < 0 ? null : km;
}

const codeKey = (code: string) => {
  const parsed = parseDtc(code);
  return parsed.ok ? parsed.dtc.code : code.slice(0, 5).toUpperCase();
};

function groupOf(code: string): { group: string; label: string } | null {
  const parsed = parseDtc(code);
  if (!parsed.ok) return null;
  const c = classifyDtc(parsed.dtc.code);
  return c.group ? { group: c.group, label: c.groupLabel ?? c.group } : null;
}

const causeSystem = (cause: string | null) => (cause ? (cause.split('/')[0] ?? null) : null);

/** Why two visits are the same fault, strongest reason first; null when they are not. */
export function faultLink(a: Pick<Visit, 'codes' | 'symptoms' | 'cause'>, b: Pick<Visit, 'codes' | 'symptoms' | 'cause'>): FaultLink | null {
  const codesA = new Set(a.codes.map(codeKey));
  const sameCode = b.codes.map(codeKey).find((c) => codesA.has(c));
  if (sameCode) return { kind: 'same-code', on: sameCode, reason: `same code ${sameCode}` };
  for (const cb of b.codes) {
    const gb = groupOf(cb);
    const ca = gb && a.codes.find((c) => groupOf(c)?.group === gb.group);
    if (gb && ca) return { kind: 'same-code-group', on: gb.group, reason: `same system: ${gb.label} (${codeKey(ca)}, then ${codeKey(cb)})` };
  }
  const system = causeSystem(a.cause);
  if (system && system === causeSystem(b.cause)) return { kind: 'same-cause-system', on: system, reason: `same system ${system}` };
  const tagsA = new Set(a.symptoms.filter((t) => !GENERIC_TAGS.has(t)));
  const tag = b.symptoms.find((t) => tagsA.has(t));
  if (tag) return { kind: 'same-symptom', on: tag, reason: `same symptom ${tag}` };
  return null;
}

const visitOrder = (a: Visit, b: Visit) => a.day.localeCompare(b.day) || a.id - b.id;

/** Whether `later` is a comeback of `earlier` under the window; the pair when it is. */
export function comebackBetween(earlier: Visit, later: Visit, window: ComebackWindow): ComebackPair | null {
  if (earlier.vehicleId === null || earlier.vehicleId !== later.vehicleId || earlier.id === later.id) return null;
  if (!earlier.confirmed || visitOrder(earlier, later) >= 0) return null;
  const days = daysBetween(earlier.day, later.day);
  if (days < 0 || days > window.days) return null;
  const km = distanceKm(earlier, later);
  if (km !== null && km > window.km) return null;
  const link = faultLink(earlier, later);
  return link ? { firstId: earlier.id, repeatId: later.id, vehicleId: later.vehicleId, days, km, link } : null;
}

/** Every comeback among the visits, one per returning visit, in visit order. */
export function findComebacks(visits: readonly Visit[], window: ComebackWindow = DEFAULT_WINDOW): ComebackPair[] {
  const byVehicle = new Map<number, Visit[]>();
  for (const v of visits) if (v.vehicleId !== null) byVehicle.set(v.vehicleId, [...(byVehicle.get(v.vehicleId) ?? []), v]);
  const pairs: ComebackPair[] = [];
  for (const list of byVehicle.values()) {
    const ordered = [...list].sort(visitOrder);
    ordered.forEach((later, i) => {
      for (let j = i - 1; j >= 0; j--) {
        const pair = comebackBetween(ordered[j]!, later, window);
        if (pair) {
          pairs.push(pair);
          break;
        }
      }
    });
  }
  return pairs;
}
