// Photos (camera on a phone), scan files, PDFs: uploaded with a progress bar; images can go into the note.
import { createElement, useRef, useState } from 'react';
import { View } from 'react-native';
import { ATTACHMENT_MAX_BYTES, type Attachment } from '../../shared/schemas/cases';
import { ApiError } from '../api/client';
import { useTheme } from '../theme/use-theme';
import { Button } from '../ui/button';
import { Notice } from '../ui/notice';
import { Row } from '../ui/surfaces';
import { Heading, Text } from '../ui/text';
import { uploadAttachment } from './api';
import { fileSize } from './labels';
import { Icon, type IconName } from '../ui/icon';

const ACCEPT = 'image/jpeg,image/png,image/webp,application/pdf,text/csv,text/plain,.csv,.txt,.pdf';

interface Upload {
  name: string;
  fraction: number;
}

/** A hidden native file input (react-native-web renders through react-dom), opened by a themed button. */
function FilePicker({ label, icon, accept, capture, onFile, disabled }: { label: string; icon: IconName; accept: string; capture?: string; onFile: (f: File) => void; disabled?: boolean }) {
  const ref = useRef<HTMLInputElement | null>(null);
  return (
    <>
      {createElement('input', {
        ref,
        type: 'file',
        accept,
        capture,
        'aria-label': label,
        style: { display: 'none' },
        onChange: (e: { target: HTMLInputElement }) => {
          const file = e.target.files?.[0];
          e.target.value = '';
          if (file) onFile(file);
        },
      })}
      <Button kind="secondary" compact label={label} icon={icon} disabled={disabled} onPress={() => ref.current?.click()} />
    </>
  );
}

export function AttachmentsPanel({ caseId, attachments, ensureSaved, onUploaded, onInsert }: { caseId: number | null; attachments: Attachment[]; ensureSaved: () => Promise<number | null>; onUploaded: (a: Attachment) => void; onInsert: (a: Attachment) => void }) {
  const t = useTheme();
  const [upload, setUpload] = useState<Upload | null>(null);
  const [message, setMessage] = useState<{ tone: 'error' | 'success'; text: string } | null>(null);
  const send = async (file: File) => {
    setMessage(null);
    if (file.size > ATTACHMENT_MAX_BYTES) return setMessage({ tone: 'error', text: `${file.name} is ${fileSize(file.size)}; the limit is 15 MB.` });
    const id = caseId ?? (await ensureSaved());
    if (!id) return setMessage({ tone: 'error', text: 'Give the case a title first, so the file has a case to belong to.' });
    setUpload({ name: file.name, fraction: 0 });
    try {
      const a = await uploadAttachment(id, file, (fraction) => setUpload({ name: file.name, fraction }));
      onUploaded(a);
      setMessage({ tone: 'success', text: `${a.name} attached.` });
    } catch (err) {
      setMessage({ tone: 'error', text: err instanceof ApiError ? err.message : 'The upload failed.' });
    } finally {
      setUpload(null);
    }
  };
  const pct = upload ? Math.round(upload.fraction * 100) : 0;
  return (
    <View style={{ gap: t.space.sm }}>
      <Heading level={3}>Attachments</Heading>
      <Text variant="small" tone="slate">
        Photos, scan-tool exports (CSV, TXT) and PDFs, up to 15 MB each.
      </Text>
      <Row wrap>
        <FilePicker label="Take photo" icon="camera" accept="image/*" capture="environment" onFile={send} disabled={Boolean(upload)} />
        <FilePicker label="Add file" icon="add" accept={ACCEPT} onFile={send} disabled={Boolean(upload)} />
      </Row>
      {upload ? (
        <View style={{ gap: t.space.xs }}>
          <Text variant="small">
            Uploading {upload.name} — {pct} %
          </Text>
          <View role="progressbar" aria-valuenow={pct} aria-valuemin={0} aria-valuemax={100} aria-label={`Uploading ${upload.name}`} style={{ height: 8, borderRadius: t.radius.pill, backgroundColor: t.colour.sand, overflow: 'hidden' }}>
            <View style={{ width: `${pct}%`, height: '100%', backgroundColor: t.colour.tide }} />
          </View>
        </View>
      ) : null}
      {message ? <Notice tone={message.tone}>{message.text}</Notice> : null}
      {attachments.map((a) => (
        <Row key={a.id} wrap style={{ justifyContent: 'space-between' }}>
          <Row style={{ gap: 4, flexShrink: 1 }}>
            <Icon name={a.mime.startsWith('image/') ? 'image' : 'file'} size={14} tone="slate" />
            <Text variant="small" style={{ flexShrink: 1 }}>
              {a.name} · {fileSize(a.size)}
            </Text>
          </Row>
          {a.mime.startsWith('image/') ? <Button kind="quiet" compact label="Insert in note" onPress={() => onInsert(a)} /> : null}
        </Row>
      ))}
    </View>
  );
}
