// The filter sheet: platform, status, code and tag. Slides up from the bottom on a phone.
import { useState } from 'react';
import { Modal, Pressable, ScrollView, View } from 'react-native';
import { caseStatuses } from '../../shared/roles';
import { statusLabel } from '../cases/labels';
import { usePlatforms } from '../platforms/api';
import { useBreakpoint, useTheme } from '../theme/use-theme';
import { Button } from '../ui/button';
import { Choice } from '../ui/choice';
import { Sheet } from '../ui/sheet';
import { Row } from '../ui/surfaces';
import { Heading, Text } from '../ui/text';
import { TextField } from '../ui/text-field';

export interface Filters {
  platformId?: string;
  code?: string;
  tag?: string;
  status?: string;
}

const ANY = 'any';

export function FilterSheet({ open, value, onApply, onClose }: { open: boolean; value: Filters; onApply: (f: Filters) => void; onClose: () => void }) {
  const t = useTheme();
  const { isWide } = useBreakpoint();
  const { data } = usePlatforms();
  const [draft, setDraft] = useState<Filters>(value);
  const set = (k: keyof Filters) => (v: string) => setDraft((d) => ({ ...d, [k]: v && v !== ANY ? v : undefined }));
  const platformOptions = [{ value: ANY, label: 'Any platform' }, ...(data?.platforms ?? []).map((p) => ({ value: String(p.id), label: `${p.make} ${p.model} ${p.engine}` }))];
  const statusOptions = [{ value: ANY, label: 'Any status' }, ...caseStatuses.map((s) => ({ value: s, label: statusLabel[s].label }))];
  return (
    <Sheet
      open={open}
      title="Filters"
      onClose={onClose}
      onShow={() => setDraft(value)}
      footer={
        <Row>
          <Button label="Show results" grow onPress={() => onApply(draft)} />
          <Button label="Clear" kind="secondary" onPress={() => onApply({})} />
        </Row>
      }
    >
          <Choice label="Status" options={statusOptions} value={draft.status ?? ANY} onChange={set('status')} />
          <Choice label="Platform" options={platformOptions} value={draft.platformId ?? ANY} onChange={set('platformId')} />
          <TextField label="Code" value={draft.code ?? ''} onChangeText={set('code')} autoCapitalize="characters" placeholder="P0302" mono />
          <TextField label="Symptom or recent-work tag" value={draft.tag ?? ''} onChangeText={set('tag')} autoCapitalize="none" placeholder="rough-idle" />
          <Text variant="small" tone="slate">
            Filters keep only matching cases; the words you typed still decide the order.
          </Text>
    </Sheet>
  );
}
