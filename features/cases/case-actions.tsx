// What the signed-in person may do with this case, straight from the server's `permissions`.
import { useRouter, type Href } from 'expo-router';
import { useState } from 'react';
import { View } from 'react-native';
import type { CaseDetail } from '../../shared/schemas/cases';
import { ApiError } from '../api/client';
import { useTheme } from '../theme/use-theme';
import { Button } from '../ui/button';
import { Choice } from '../ui/choice';
import { Notice } from '../ui/notice';
import { Card, Row } from '../ui/surfaces';
import { Heading, Text } from '../ui/text';
import { TextField } from '../ui/text-field';
import { caseAction, deleteCase, exportUrl } from './api';
import { CauseRow } from './cause-picker';

type Open = null | 'return' | 'confirm' | 'delete';

/** Downloads go through the browser so the server's Content-Disposition names the file. */
function download(url: string) {
  if (typeof window !== 'undefined') window.location.assign(url);
}

/** No cause linked yet: the suggestions to pick from; with none picked the server links a clear best match. */
function ConfirmCause({ c, value, onChange }: { c: CaseDetail; value: string | null; onChange: (cause: string | null) => void }) {
  const t = useTheme();
  const top = c.causeSuggestions.slice(0, 3);
  return (
    <View style={{ gap: t.space.xs }}>
      <Text variant="small" weight="semibold">
        No cause in the trees is linked yet
      </Text>
      <Text variant="small" tone="slate">
        {top.length
          ? 'Pick the cause you confirmed so the walk learns from it. If you pick none, the best match is linked when it is clearly ahead.'
          : 'Nothing in the write-up matches a tree cause; edit the case to pick one from the full list.'}
      </Text>
      {top.length ? (
        <View role="radiogroup" aria-label="Suggested causes" style={{ gap: t.space.xs }}>
          {top.map((s) => (
            <CauseRow key={s.cause} option={s} score={s.score} selected={s.cause === value} onPress={() => onChange(s.cause)} />
          ))}
          <Choice label="Or" options={[{ value: '', label: 'Let Causeway decide' }]} value={value ?? ''} onChange={() => onChange(null)} />
        </View>
      ) : null}
    </View>
  );
}

export function CaseActions({ c, onChanged }: { c: CaseDetail; onChanged: (message: string) => void }) {
  const t = useTheme();
  const router = useRouter();
  const p = c.permissions;
  const [open, setOpen] = useState<Open>(null);
  const [text, setText] = useState('');
  const [cause, setCause] = useState<string | null>(null);
  const [busy, setBusy] = useState<string | null>(null);
  const [error, setError] = useState<{ message: string; field?: string } | null>(null);

  const run = async (name: string, action: () => Promise<unknown>, done: string) => {
    setBusy(name);
    setError(null);
    try {
      await action();
      setOpen(null);
      setText('');
      onChanged(done);
    } catch (err) {
      const e = err instanceof ApiError ? err : null;
      setError({ message: e?.message ?? 'That did not work. Try again.', field: e ? Object.values(e.fields)[0] : undefined });
    } finally {
      setBusy(null);
    }
  };
  const toggle = (what: Open) => {
    setError(null);
    setText('');
    setOpen(open === what ? null : what);
  };

  return (
    <Card style={{ gap: t.space.sm }}>
      <Heading level={3}>Actions</Heading>
      {error ? <Notice tone="error">{error.message}</Notice> : null}
      {p.edit ? <Button label="Edit" icon="edit" onPress={() => router.push(`/cases/${c.id}/edit` as Href)} /> : null}
      {p.submit ? <Button kind="secondary" label="Send for review" icon="next" busy={busy === 'submit'} onPress={() => run('submit', () => caseAction(c.id, 'submit'), 'Sent for review. The senior techs have been e-mailed.')} /> : null}
      {p.publish ? <Button label="Publish" icon="published" busy={busy === 'publish'} onPress={() => run('publish', () => caseAction(c.id, 'publish'), 'Published: everyone in the shop can find it now.')} /> : null}
      {p.return ? <Button kind="secondary" label="Return with comment" icon="returned" onPress={() => toggle('return')} /> : null}
      {open === 'return' ? (
        <View style={{ gap: t.space.sm }}>
          <TextField label="What needs changing" multiline numberOfLines={3} value={text} onChangeText={setText} error={error?.field} />
          <Button label="Return to the author" busy={busy === 'return'} onPress={() => run('return', () => caseAction(c.id, 'return', { comment: text }), 'Returned. The author has been e-mailed your comment.')} />
        </View>
      ) : null}
      {p.confirm && !c.confirmation ? <Button kind="secondary" label="Confirm fix" icon="check" disabled={!c.fix?.trim()} onPress={() => toggle('confirm')} /> : null}
      {p.confirm && !c.confirmation && !c.fix?.trim() ? (
        <Text variant="small" tone="slate">
          A fix can be confirmed once it is written down: edit the case and fill in Fix.
        </Text>
      ) : null}
      {open === 'confirm' ? (
        <View style={{ gap: t.space.sm }}>
          <TextField label="Confirmation note (optional)" hint="e.g. car back after 2 weeks, no codes, fuel trims within 5 %" multiline numberOfLines={3} value={text} onChangeText={setText} error={error?.field} />
          {c.cause ? null : <ConfirmCause c={c} value={cause} onChange={setCause} />}
          <Button
            label="Confirm the fix held"
            busy={busy === 'confirm'}
            onPress={() => run('confirm', () => caseAction(c.id, 'confirm', { ...(text.trim() ? { note: text.trim() } : {}), ...(cause ? { cause } : {}) }), 'Fix confirmed.')}
          />
        </View>
      ) : null}
      <Button kind="quiet" label="Export as Markdown" icon="download" onPress={() => download(exportUrl(c.id))} />
      {p.delete ? <Button kind="danger" label="Delete case" icon="close" onPress={() => toggle('delete')} /> : null}
      {open === 'delete' ? (
        <View style={{ gap: t.space.sm, padding: t.space.md, borderRadius: t.radius.md, backgroundColor: t.colour.brickFill }}>
          <Text weight="semibold">Delete “{c.title}”?</Text>
          <Text variant="small">It disappears from the list and from search for everyone in the shop.</Text>
          <Row wrap>
            <Button kind="danger" label="Yes, delete it" busy={busy === 'delete'} onPress={() => run('delete', async () => { await deleteCase(c.id); router.replace('/cases' as Href); }, 'Deleted.')} />
            <Button kind="quiet" label="Keep it" onPress={() => setOpen(null)} />
          </Row>
        </View>
      ) : null}
    </Card>
  );
}
