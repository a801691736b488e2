// On a case: readiness snapshots over time and a form to add one from the scan tool.
import { useState } from 'react';
import { View } from 'react-native';
import { ApiError } from '../api/client';
import { useTheme } from '../theme/use-theme';
import { Button } from '../ui/button';
import { EmptyState, Loaded } from '../ui/states';
import { Card } from '../ui/surfaces';
import { Heading, Text } from '../ui/text';
import { TextField } from '../ui/text-field';
import { addSnapshot, useCaseReadiness } from './api';
import { SnapshotList } from './snapshot-list';

function AddSnapshot({ caseId, first, onAdded }: { caseId: number; first: boolean; onAdded: () => void }) {
  const t = useTheme();
  const [label, setLabel] = useState(first ? 'Before drive cycle' : 'After drive cycle');
  const [pasted, setPasted] = useState('');
  const [busy, setBusy] = useState(false);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const save = async () => {
    setBusy(true);
    setErrors({});
    try {
      await addSnapshot(caseId, label, pasted);
      setPasted('');
      setLabel('After drive cycle');
      onAdded();
    } catch (err) {
      const fields = err instanceof ApiError ? err.fields : {};
      const message = err instanceof ApiError ? err.message : 'Could not save the snapshot.';
      setErrors({ label: fields.label ?? '', pasted: fields.bytes ?? fields.text ?? (fields.label ? '' : message) });
    } finally {
      setBusy(false);
    }
  };
  return (
    <View style={{ gap: t.space.sm }}>
      <TextField label="Snapshot label" value={label} onChangeText={setLabel} error={errors.label || undefined} maxLength={80} />
      <TextField
        label="Monitor status from the scan tool"
        hint="The service $01 PID $01 answer (41 01 00 07 65 04) or the monitor table as printed."
        mono
        multiline
        numberOfLines={4}
        value={pasted}
        onChangeText={setPasted}
        error={errors.pasted || undefined}
      />
      <Button kind="secondary" compact label="Save snapshot" busy={busy} disabled={!pasted.trim() || !label.trim()} onPress={save} />
    </View>
  );
}

export function CaseReadinessPanel({ caseId }: { caseId: number }) {
  const t = useTheme();
  const { data, error, mutate } = useCaseReadiness(caseId);
  return (
    <Card style={{ gap: t.space.md }} aria-label="Emissions readiness">
      <Heading level={2}>Emissions readiness</Heading>
      <Loaded data={data} error={error} retry={() => void mutate()}>
        {({ snapshots }) => (
          <View style={{ gap: t.space.md }}>
            {snapshots.length === 0 ? (
              <EmptyState title="No monitor status saved" hint="Paste what the scan tool shows before the drive cycle, then again after it." />
            ) : (
              <SnapshotList snapshots={snapshots} />
            )}
            <Text weight="semibold">Add a snapshot</Text>
            <AddSnapshot caseId={caseId} first={snapshots.length === 0} onAdded={() => void mutate()} />
          </View>
        )}
      </Loaded>
    </Card>
  );
}
