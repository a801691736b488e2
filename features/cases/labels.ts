// Words and symbols for case facts: status is never colour alone.
import type { ColourName } from '../theme/tokens';
import type { CaseStatus } from '../../shared/roles';
import type { IconName } from '../ui/icon';

export const statusLabel: Record<CaseStatus, { label: string; symbol: IconName; tone: ColourName }> = {
  draft: { label: 'Draft', symbol: 'edit', tone: 'slate' },
  review: { label: 'In review', symbol: 'waiting', tone: 'amber' },
  published: { label: 'Published', symbol: 'published', tone: 'tide' },
};

export const platformName = (p: { make: string; model: string; engine: string } | null) => (p ? `${p.make} ${p.model} · ${p.engine}` : 'No platform');

export function shortDate(iso: string): string {
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return iso;
  return d.toLocaleDateString(undefined, { day: 'numeric', month: 'short', year: 'numeric' });
}

export function dateTime(iso: string): string {
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return iso;
  return d.toLocaleString(undefined, { day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit' });
}

export function fileSize(bytes: number): string {
  if (bytes < 1024) return `${bytes} B`;
  if (bytes < 1024 * 1024) return `${(bytes / 1024).toFixed(0)} kB`;
  return `${(bytes / 1024 / 1024).toFixed(1)} MB`;
}
