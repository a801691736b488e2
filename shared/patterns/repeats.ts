// The repeat visits of one case, as its case view shows them.
import { findComebacks, type ComebackWindow } from './comebacks';
import type { PatternCase } from './stats';

export interface RepeatLink {
  caseId: number;
  title: string;
  relation: 'comeback-of' | 'came-back-as';
  days: number;
  reason: string;
}

/** "comeback-of" the earlier confirmed visit it returned after; "came-back-as" each later return. */
export function repeatsFor(caseId: number, all: readonly PatternCase[], window: ComebackWindow): RepeatLink[] {
  const me = all.find((c) => c.id === caseId);
  if (!me || me.vehicleId === null) return [];
  const titles = new Map(all.map((c) => [c.id, c.title]));
  const pairs = findComebacks(all.filter((c) => c.vehicleId === me.vehicleId), window);
  const links: RepeatLink[] = [];
  for (const p of pairs) {
    if (p.repeatId === caseId) links.push({ caseId: p.firstId, title: titles.get(p.firstId) ?? '', relation: 'comeback-of', days: p.days, reason: p.link.reason });
    if (p.firstId === caseId) links.push({ caseId: p.repeatId, title: titles.get(p.repeatId) ?? '', relation: 'came-back-as', days: p.days, reason: p.link.reason });
  }
  return links;
}
