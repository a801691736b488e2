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

// Dates read in the shop's time zone (features/shell/shop-clock.ts).
export { dateTime, shortDate } from '../shell/shop-clock';

export function fileSize(bytes: number): string {
  if (bytes < 1024) return `${bytes} B`;
  if (bytes < 1024 * 1024) return `${(bytes / 1024).toFixed(0)} kB`;
  return `${(bytes / 1024 / 1024).toFixed(1)} MB`;
}
