import type { PlatformView } from '../../shared/schemas/platforms';

export const layoutLabels = { inline: 'Inline', V: 'V', flat: 'Flat' } as const;
export const fuelLabels = { petrol: 'Petrol', diesel: 'Diesel', hybrid: 'Hybrid', electric: 'Electric' } as const;
export const inductionLabels = { natural: 'Naturally aspirated', turbo: 'Turbocharged', supercharged: 'Supercharged' } as const;

export const platformTitle = (p: Pick<PlatformView, 'make' | 'model'>) => `${p.make} ${p.model}`;

/** 'V6 · 2019-2026 · VT27' */
export function platformSummary(p: PlatformView): string {
  const shape = p.cylinders === 0 ? 'Electric' : p.layout === 'inline' ? `Inline ${p.cylinders}` : `${p.layout === 'V' ? 'V' : 'Flat '}${p.cylinders}`;
  const years = p.yearFrom === p.yearTo ? String(p.yearFrom) : `${p.yearFrom}–${p.yearTo}`;
  return `${p.engine} · ${shape} · ${years}`;
}
