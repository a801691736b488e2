// The case editor (/cases/new and /cases/[id]/edit): Markdown with live preview, structured fields,
// attachments and autosave that keeps everything on the device until the server has it.
import { useLocalSearchParams, useRouter, type Href } from 'expo-router';
import { useEffect, useRef, useState } from 'react';
import { ScrollView, View } from 'react-native';
import { isSeniorOrAbove } from '../../shared/policy';
import type { Attachment, CaseDetail, NoteExtract } from '../../shared/schemas/cases';
import { ApiError } from '../api/client';
import { useSession } from '../auth/use-session';
import { MarkdownView } from '../markdown/markdown-view';
import { useBreakpoint, useTheme } from '../theme/use-theme';
import { Button } from '../ui/button';
import { Choice } from '../ui/choice';
import { Notice } from '../ui/notice';
import { EmptyState, Loaded } from '../ui/states';
import { Card, Row, Screen } from '../ui/surfaces';
import { Heading, Text } from '../ui/text';
import { TextField } from '../ui/text-field';
import { caseAction, previewNote, useCase } from './api';
import { AttachmentsPanel } from './attachments-panel';
import { deviceStore, draftKey, emptyFields, fieldsFromCase, readDraft, saveStateLabel, type DraftFields, type StoredDraft } from './draft';
import { CausePicker, useCauseSuggestions } from './cause-picker';
import { CodeChips, PlatformPicker, SymptomTags, VinField } from './editor-fields';
import { NoteEditor } from './note-editor';
import { useAutosave } from './use-autosave';

type Finish = 'draft' | 'review' | 'published';

interface EditorProps {
  storageKey: string;
  initial: StoredDraft;
  startInConflict?: CaseDetail | null;
  server: CaseDetail | null;
  canSubmit: boolean;
  canPublish: boolean;
  notice?: { text: string; action?: { label: string; onPress: () => void } };
}

function useNoteExtract(body: string): NoteExtract | null {
  const [extract, setExtract] = useState<NoteExtract | null>(null);
  useEffect(() => {
    if (!body.trim()) return setExtract(null);
    const timer = setTimeout(() => {
      previewNote(body)
        .then(setExtract)
        .catch(() => undefined); // suggestions are a help, not a requirement
    }, 800);
    return () => clearTimeout(timer);
  }, [body]);
  return extract;
}

function ConflictPanel({ mine, theirs, onKeepMine, onTakeTheirs }: { mine: DraftFields; theirs: CaseDetail; onKeepMine: () => void; onTakeTheirs: () => void }) {
  const t = useTheme();
  const { isWide } = useBreakpoint();
  const other = fieldsFromCase(theirs);
  const column = (label: string, f: DraftFields) => (
    <View style={{ flex: 1, gap: t.space.xs }}>
      <Text weight="semibold">{label}</Text>
      <Text serif weight="semibold">{f.title}</Text>
      <Text variant="small" tone="slate">Codes: {f.codes.join(', ') || 'none'} · Root cause: {f.rootCause || '—'} · Fix: {f.fix || '—'}</Text>
      <ScrollView style={{ maxHeight: 220, borderWidth: 1, borderColor: t.colour.line, borderRadius: t.radius.sm, padding: t.space.sm, backgroundColor: t.colour.card }}>
        <Text mono variant="small">{f.body || '(empty note)'}</Text>
      </ScrollView>
    </View>
  );
  return (
    <Card role="alert" style={{ borderColor: t.colour.brick, borderWidth: 2, gap: t.space.md }}>
      <Heading level={2}>Someone else saved a newer version</Heading>
      <Text>
        Version {theirs.version} was saved while you were editing. Both are shown below; pick the one to keep. Your text stays on this device until you choose.
      </Text>
      <View style={{ flexDirection: isWide ? 'row' : 'column', gap: t.space.md }}>
        {column('Yours (on this device)', mine)}
        {column(`Theirs (version ${theirs.version}, on the server)`, other)}
      </View>
      <Row wrap>
        <Button label="Keep mine" icon="check" onPress={onKeepMine} />
        <Button kind="secondary" label="Take theirs" onPress={onTakeTheirs} />
      </Row>
    </Card>
  );
}

function CaseEditor({ storageKey, initial, startInConflict, server, canSubmit, canPublish, notice }: EditorProps) {
  const t = useTheme();
  const router = useRouter();
  const { isWide } = useBreakpoint();
  const auto = useAutosave(storageKey, initial, { startInConflict });
  const f = auto.fields;
  const extract = useNoteExtract(f.body);
  const causeSuggestions = useCauseSuggestions({ title: f.title, rootCause: f.rootCause, fix: f.fix, platformId: f.platformId, codes: f.codes, symptoms: f.symptoms });
  const [mode, setMode] = useState<'write' | 'preview'>('write');
  const [attachments, setAttachments] = useState<Attachment[]>(server?.attachments ?? []);
  const [finish, setFinish] = useState<Finish>(server?.status ?? 'draft');
  const [doneError, setDoneError] = useState<string | null>(null);
  const [discarded, setDiscarded] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const insertRef = useRef<((text: string) => void) | null>(null);
  const e = auto.errors;

  const finishOptions = [
    { value: 'draft' as const, label: server?.status === 'review' ? 'Leave in review' : 'Keep as draft' },
    ...(canSubmit && server?.status !== 'review' ? [{ value: 'review' as const, label: 'Send for review' }] : []),
    ...(canPublish ? [{ value: 'published' as const, label: 'Publish' }] : []),
  ];
  const showFinish = server?.status !== 'published' && finishOptions.length > 1;

  const done = async () => {
    setDoneError(null);
    setBusy(true);
    try {
      const id = await auto.saveNow();
      if (!id) return setDoneError('Not saved yet: ' + saveStateLabel(auto.saveState).replace(/^Not saved — /, '') + '. Your work is kept on this device.');
      if (finish === 'review' && server?.status !== 'review') await caseAction(id, 'submit');
      if (finish === 'published' && server?.status !== 'published') await caseAction(id, 'publish');
      deviceStore()?.removeItem(storageKey);
      router.replace(`/cases/${id}` as Href);
    } catch (err) {
      setDoneError(err instanceof ApiError ? err.message : 'Saved, but the status could not be changed. Try again from the case.');
    } finally {
      setBusy(false);
    }
  };

  const suggested = [...new Set([...(extract?.suggestedCodes ?? []), ...(extract?.codes ?? [])])];
  const preview = (
    <Card style={{ flex: 1, gap: t.space.sm }} aria-label="Preview">
      <Text variant="caption" weight="semibold" tone="slate">
        PREVIEW
      </Text>
      <MarkdownView body={f.body} attachments={attachments} />
      {extract?.measurements.length ? (
        <Text variant="small" tone="slate">
          Readings found: {extract.measurements.map((m) => m.raw).join(' · ')}
        </Text>
      ) : null}
    </Card>
  );
  const writer = (
    <View style={{ flex: 1 }}>
      <NoteEditor value={f.body} onChange={(body) => auto.update({ body })} error={e.body} insertRef={insertRef} />
    </View>
  );
  const footer = (
    <>
      <View style={{ flex: 1, justifyContent: 'center' }}>
        <Text role="status" aria-live="polite" variant="small" tone={auto.saveState.kind === 'saved' ? 'moss' : auto.saveState.kind === 'error' || auto.saveState.kind === 'conflict' ? 'brick' : 'slate'}>
          {saveStateLabel(auto.saveState)}
        </Text>
      </View>
      <Button label="Done" busy={busy} onPress={done} />
    </>
  );

  return (
    <Screen footer={footer}>
      <Heading>{server ? 'Edit case' : 'New case'}</Heading>
      {notice ? (
        <View style={{ gap: t.space.xs }}>
          <Notice tone="info">{notice.text}</Notice>
          {notice.action ? <Button kind="quiet" compact label={notice.action.label} onPress={notice.action.onPress} /> : null}
        </View>
      ) : null}
      {auto.localFailed ? <Notice tone="error">This browser would not keep a copy on the device (private mode or full storage). Stay online until it says Saved.</Notice> : null}
      {doneError ? <Notice tone="error">{doneError}</Notice> : null}
      {auto.conflict ? (
        <ConflictPanel
          mine={f}
          theirs={auto.conflict}
          onKeepMine={auto.keepMine}
          onTakeTheirs={() => {
            setDiscarded(f.body);
            auto.takeTheirs();
          }}
        />
      ) : null}
      {discarded !== null ? (
        <Card style={{ gap: t.space.sm }}>
          <Text weight="semibold">Your discarded note, to copy from</Text>
          <Text mono variant="small" selectable>{discarded || '(empty)'}</Text>
          <Button kind="quiet" compact label="Hide" onPress={() => setDiscarded(null)} />
        </Card>
      ) : null}
      <TextField label="Title" value={f.title} onChangeText={(title) => auto.update({ title })} error={e.title && f.title ? e.title : undefined} placeholder="e.g. Misfire cyl 2 under load: coil boot tracking" />
      {isWide ? (
        <View style={{ flexDirection: 'row', gap: t.space.lg, alignItems: 'flex-start' }}>
          {writer}
          {preview}
        </View>
      ) : (
        <View style={{ gap: t.space.md }}>
          <Choice label="Show" options={[{ value: 'write', label: 'Write' }, { value: 'preview', label: 'Preview' }] as const} value={mode} onChange={setMode} />
          {mode === 'write' ? writer : preview}
        </View>
      )}
      <View style={{ flexDirection: isWide ? 'row' : 'column', gap: t.space.lg, alignItems: 'flex-start' }}>
        <Card style={{ flex: isWide ? 1 : undefined, width: isWide ? undefined : '100%', gap: t.space.lg }}>
          <Heading level={3}>Codes and symptoms</Heading>
          <CodeChips codes={f.codes} suggested={suggested} onChange={(codes) => auto.update({ codes })} error={e.codes} />
          <SymptomTags tags={f.symptoms} onChange={(symptoms) => auto.update({ symptoms })} error={e.symptoms} />
        </Card>
        <Card style={{ flex: isWide ? 1 : undefined, width: isWide ? undefined : '100%', gap: t.space.md }}>
          <Heading level={3}>Vehicle</Heading>
          <PlatformPicker value={f.platformId} onChange={(platformId) => auto.update({ platformId })} />
          <VinField value={f.vin} onChange={(vin) => auto.update({ vin })} error={e.vin} />
          <Row wrap style={{ alignItems: 'flex-start' }}>
            <View style={{ flexGrow: 1, flexBasis: 140 }}>
              <TextField label="Plate" value={f.plate} onChangeText={(plate) => auto.update({ plate })} error={e.plate} autoCapitalize="characters" />
            </View>
            <View style={{ flexGrow: 1, flexBasis: 140 }}>
              <TextField label="Mileage" mono inputMode="numeric" value={f.mileage} onChangeText={(mileage) => auto.update({ mileage })} error={e.mileage} />
            </View>
          </Row>
          <Choice label="Mileage unit" options={[{ value: 'km', label: 'km' }, { value: 'mi', label: 'miles' }] as const} value={f.mileageUnit} onChange={(mileageUnit) => auto.update({ mileageUnit })} />
          <TextField label="Visit date" mono placeholder="YYYY-MM-DD" value={f.visitDate} onChangeText={(visitDate) => auto.update({ visitDate })} error={e.visitDate} />
        </Card>
      </View>
      <Card style={{ gap: t.space.md }}>
        <Heading level={3}>Cause and fix</Heading>
        <TextField label="Root cause" multiline numberOfLines={3} value={f.rootCause} onChangeText={(rootCause) => auto.update({ rootCause })} error={e.rootCause} />
        <TextField label="Fix" multiline numberOfLines={3} value={f.fix} onChangeText={(fix) => auto.update({ fix })} error={e.fix} />
        <CausePicker value={f.cause} onChange={(cause) => auto.update({ cause })} suggestions={causeSuggestions} />
      </Card>
      <Card>
        <AttachmentsPanel
          caseId={auto.caseId}
          attachments={attachments}
          ensureSaved={auto.saveNow}
          onUploaded={(a) => setAttachments((list) => [...list, a])}
          onInsert={(a) => insertRef.current?.(`\n![${a.name.replace(/[[\]]/g, '')}](/api/attachments/${a.id})\n`)}
        />
      </Card>
      {showFinish ? (
        <Card>
          <Choice label="When you press Done" options={finishOptions} value={finish} onChange={setFinish} />
        </Card>
      ) : null}
    </Screen>
  );
}

const freshDraft = (): StoredDraft => ({ caseId: null, version: null, fields: emptyFields(), dirty: false, savedAt: null });

function NewCaseEditor({ userId, canPublish, onStartFresh }: { userId: number; canPublish: boolean; onStartFresh: () => void }) {
  const key = draftKey(userId, 'new');
  // Read once per mount: autosave rewrites this entry while the person types.
  const [stored] = useState(() => readDraft(deviceStore(), key));
  const resumed = stored && (stored.dirty || stored.caseId !== null);
  return (
    <CaseEditor
      storageKey={key}
      initial={stored ?? freshDraft()}
      server={null}
      canSubmit
      canPublish={canPublish}
      notice={resumed ? { text: 'Continuing the case you started on this device.', action: { label: 'Start a fresh case instead', onPress: onStartFresh } } : undefined}
    />
  );
}

export function NewCaseScreen() {
  const { user } = useSession();
  const [generation, setGeneration] = useState(0);
  if (!user) return null;
  const startFresh = () => {
    deviceStore()?.removeItem(draftKey(user.id, 'new'));
    setGeneration((g) => g + 1);
  };
  return <NewCaseEditor key={generation} userId={user.id} canPublish={isSeniorOrAbove(user)} onStartFresh={startFresh} />;
}

function EditLoaded({ c, userId }: { c: CaseDetail; userId: number }) {
  const key = draftKey(userId, c.id);
  // Decided once: later revalidations of the case must not reset what is being typed.
  const [start] = useState(() => {
    const stored = readDraft(deviceStore(), key);
    if (stored?.dirty && stored.caseId === c.id) {
      const stale = stored.version !== c.version;
      return { initial: stored, conflict: stale ? c : null, notice: stale ? undefined : { text: 'Restored your unsaved changes from this device.' } };
    }
    return { initial: { caseId: c.id, version: c.version, fields: fieldsFromCase(c), dirty: false, savedAt: null }, conflict: null, notice: undefined };
  });
  return <CaseEditor storageKey={key} initial={start.initial} startInConflict={start.conflict} server={c} canSubmit={c.permissions.submit} canPublish={c.permissions.publish} notice={start.notice} />;
}

export function EditCaseScreen() {
  const { id } = useLocalSearchParams<{ id: string }>();
  const caseId = Number(id);
  const { user } = useSession();
  const { data, error, mutate } = useCase(Number.isInteger(caseId) && caseId > 0 ? caseId : null);
  const [frozen, setFrozen] = useState<CaseDetail | null>(null);
  useEffect(() => {
    if (data && !frozen) setFrozen(data.case);
  }, [data, frozen]);
  if (!user) return null;
  if (error instanceof ApiError && error.status === 404)
    return (
      <Screen>
        <EmptyState title="No such case" hint="It may have been deleted, or it belongs to another shop." />
      </Screen>
    );
  if (!frozen)
    return (
      <Screen>
        <Loaded data={data} error={error} retry={() => void mutate()} lines={6}>
          {() => null}
        </Loaded>
      </Screen>
    );
  if (!frozen.permissions.edit)
    return (
      <Screen>
        <EmptyState title="You cannot edit this case" hint="Published cases are edited by senior techs and managers; drafts by their author. Add a comment on the case instead." />
      </Screen>
    );
  return <EditLoaded c={frozen} userId={user.id} />;
}
