// One case: the rendered note in a reading column, facts and actions beside it on wide screens.
import { Link, useLocalSearchParams, type Href } from 'expo-router';
import { useState } from 'react';
import { useSWRConfig } from 'swr';
import { View } from 'react-native';
import type { CaseDetail } from '../../shared/schemas/cases';
import { ApiError } from '../api/client';
import { MarkdownView } from '../markdown/markdown-view';
import { useBreakpoint, useTheme } from '../theme/use-theme';
import { Badge } from '../ui/badges';
import { Button } from '../ui/button';
import { Notice } from '../ui/notice';
import { EmptyState, Loaded } from '../ui/states';
import { Card, Row, Screen } from '../ui/surfaces';
import { Heading, Text } from '../ui/text';
import { caseAction, casePath, useCase } from './api';
import { CaseActions } from './case-actions';
import { AttachmentGallery, CaseFacts, CauseAndFix, CommentList, RepeatVisits } from './case-parts';
import { dateTime, statusLabel } from './labels';
import { RevisionHistory } from './revisions';
import { TextField } from '../ui/text-field';
import { BackLink } from '../ui/back-link';
import { CaseReadinessPanel } from '../readiness/case-readiness-panel';

function CommentForm({ caseId, onAdded }: { caseId: number; onAdded: () => void }) {
  const t = useTheme();
  const [body, setBody] = useState('');
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | undefined>();
  const send = async () => {
    setBusy(true);
    setError(undefined);
    try {
      await caseAction(caseId, 'comments', { body });
      setBody('');
      onAdded();
    } catch (err) {
      setError(err instanceof ApiError ? (err.fields.body ?? err.message) : 'Could not add the comment.');
    } finally {
      setBusy(false);
    }
  };
  return (
    <View style={{ gap: t.space.sm }}>
      <TextField label="Add a comment" multiline numberOfLines={2} value={body} onChangeText={setBody} error={error} />
      <Button kind="secondary" compact label="Add comment" busy={busy} disabled={!body.trim()} onPress={send} />
    </View>
  );
}

function Header({ c }: { c: CaseDetail }) {
  const t = useTheme();
  const s = statusLabel[c.status];
  return (
    <View style={{ gap: t.space.sm }}>
      <BackLink href={'/cases' as Href} label="All cases" />
      <Heading>{c.title}</Heading>
      <Row wrap>
        <Badge label={s.label} symbol={s.symbol} tone={s.tone} />
        {c.fixConfirmed ? <Badge label="Fix confirmed" symbol="check" tone="moss" /> : null}
        <Text variant="small" tone="slate">
          {c.author.name} · v{c.version} · updated {dateTime(c.updatedAt)}
        </Text>
      </Row>
    </View>
  );
}

function CaseBody({ c, onChanged }: { c: CaseDetail; onChanged: (msg: string) => void }) {
  const t = useTheme();
  const { isWide } = useBreakpoint();
  const note = (
    <Card style={{ gap: t.space.sm }}>
      <MarkdownView body={c.body} attachments={c.attachments} />
    </Card>
  );
  const review = (
    <Card style={{ gap: t.space.md }}>
      <Heading level={3}>Review comments</Heading>
      <CommentList comments={c.comments} />
      <CommentForm caseId={c.id} onAdded={() => onChanged('Comment added.')} />
    </Card>
  );
  const gallery = (
    <Card>
      <AttachmentGallery attachments={c.attachments} />
    </Card>
  );
  if (isWide)
    return (
      <View style={{ flexDirection: 'row', gap: t.space.xl, alignItems: 'flex-start' }}>
        <View style={{ flex: 1, maxWidth: t.layout.readingWidth + 2 * t.space.lg, gap: t.space.lg }}>
          {note}
          {gallery}
          {review}
          <RevisionHistory caseId={c.id} />
        </View>
        <View style={{ width: 340, gap: t.space.lg }}>
          <CaseActions c={c} onChanged={onChanged} />
          <CaseFacts c={c} />
          <CauseAndFix c={c} />
          <RepeatVisits repeats={c.repeats} />
          <CaseReadinessPanel caseId={c.id} />
        </View>
      </View>
    );
  return (
    <View style={{ gap: t.space.lg }}>
      <CaseFacts c={c} />
      {note}
      <CauseAndFix c={c} />
      {gallery}
      <RepeatVisits repeats={c.repeats} />
      <CaseReadinessPanel caseId={c.id} />
      <CaseActions c={c} onChanged={onChanged} />
      {review}
      <RevisionHistory caseId={c.id} />
    </View>
  );
}

export function CaseScreen() {
  const { id } = useLocalSearchParams<{ id: string }>();
  const caseId = Number(id);
  const valid = Number.isInteger(caseId) && caseId > 0;
  const { data, error, mutate } = useCase(valid ? caseId : null);
  const { mutate: mutateAll } = useSWRConfig();
  const [message, setMessage] = useState<string | null>(null);
  const { isWide } = useBreakpoint();
  const notFound = !valid || (error instanceof ApiError && error.status === 404);
  const c = data?.case;
  const footer =
    !isWide && c?.permissions.edit ? (
      <Link href={`/cases/${c.id}/edit` as Href} asChild>
        <Button grow label="Edit case" icon="edit" />
      </Link>
    ) : undefined;
  return (
    <Screen footer={footer}>
      {notFound ? (
        <EmptyState title="No such case" hint="It may have been deleted, or it belongs to another shop. Go back to the list to find it." />
      ) : (
        <Loaded data={data} error={error} retry={() => void mutate()} lines={6}>
          {({ case: c }) => (
            <>
              <Header c={c} />
              {message ? <Notice tone="success">{message}</Notice> : null}
              <CaseBody
                c={c}
                onChanged={(msg) => {
                  setMessage(msg);
                  // The case, its revisions and the lists it appears in have all changed.
                  void mutateAll((key) => typeof key === 'string' && (key.startsWith(casePath(c.id)) || key.startsWith('/api/cases?') || key === '/api/cases'));
                }}
              />
            </>
          )}
        </Loaded>
      )}
    </Screen>
  );
}
