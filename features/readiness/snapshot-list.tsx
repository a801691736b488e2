// Snapshots over time (before and after a drive cycle): the latest in full, earlier ones as a line each.
import { Link, type Href } from 'expo-router';
import { View } from 'react-native';
import type { SnapshotView } from '../../shared/schemas/readiness';
import { dateTime } from '../cases/labels';
import { useTheme } from '../theme/use-theme';
import { Text } from '../ui/text';
import { ReadinessCard } from './readiness-card';

function changeLine(change: SnapshotView['change']): string | null {
  if (!change) return null;
  const parts = [
    change.finished.length ? `finished: ${change.finished.join(', ')}` : '',
    change.stillIncomplete.length ? `still incomplete: ${change.stillIncomplete.join(', ')}` : '',
    change.reset.length ? `reset: ${change.reset.join(', ')}` : '',
  ].filter(Boolean);
  return parts.length ? `Since the one before: ${parts.join('; ')}.` : 'No change since the one before.';
}

function SnapshotLine({ s, withCase }: { s: SnapshotView; withCase: boolean }) {
  const t = useTheme();
  const change = changeLine(s.change);
  return (
    <View style={{ gap: t.space.xxs, borderTopWidth: 1, borderColor: t.colour.line, paddingTop: t.space.xs }}>
      <Text variant="small" weight="semibold">
        {s.label} · {s.readiness.verdict.ready ? 'ready' : `not ready (${s.readiness.incomplete.length} incomplete)`}
      </Text>
      <Text variant="caption" tone="slate">
        {dateTime(s.takenAt)} · {s.takenBy}
      </Text>
      {withCase ? (
        <Link href={`/cases/${s.caseId}` as Href}>
          <Text variant="small" tone="tide" style={{ textDecorationLine: 'underline' }}>
            {s.caseTitle}
          </Text>
        </Link>
      ) : null}
      {change ? <Text variant="small">{change}</Text> : null}
    </View>
  );
}

export function SnapshotList({ snapshots, withCase = false }: { snapshots: SnapshotView[]; withCase?: boolean }) {
  const t = useTheme();
  const latest = snapshots.at(-1);
  if (!latest) return null;
  return (
    <View style={{ gap: t.space.md }}>
      <Text variant="small" tone="slate">
        Latest: {latest.label}, {dateTime(latest.takenAt)}
      </Text>
      {/* the drive-cycle steps belong with the job, so the vehicle view leaves them to the case */}
      <ReadinessCard answer={latest.readiness} showSteps={!withCase} />
      {snapshots.length > 1 ? (
        <View style={{ gap: t.space.sm }}>
          <Text weight="semibold">All snapshots, newest first</Text>
          {[...snapshots].reverse().map((s) => (
            <SnapshotLine key={s.id} s={s} withCase={withCase} />
          ))}
        </View>
      ) : null}
    </View>
  );
}
