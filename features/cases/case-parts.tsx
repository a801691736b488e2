// Pieces of the case view: facts, attachments, comments, repeat visits.
import { Link, type Href } from 'expo-router';
import { Image, Linking, Pressable, View } from 'react-native';
import type { Attachment, CaseDetail } from '../../shared/schemas/cases';
import { useTheme } from '../theme/use-theme';
import { Badge, CodeChip } from '../ui/badges';
import { Card, Row } from '../ui/surfaces';
import { Heading, Text } from '../ui/text';
import { dateTime, fileSize, platformName, shortDate } from './labels';
import type { IconName } from '../ui/icon';
import { Icon } from '../ui/icon';

export function Fact({ label, children }: { label: string; children: React.ReactNode }) {
  const t = useTheme();
  return (
    <View style={{ gap: t.space.xxs }}>
      <Text variant="caption" weight="semibold" tone="slate">
        {label.toUpperCase()}
      </Text>
      {typeof children === 'string' ? <Text>{children}</Text> : children}
    </View>
  );
}

/** Each code links to the code reference; the reference is keyed by the five-character code. */
export function CodeLinks({ codes }: { codes: string[] }) {
  const t = useTheme();
  if (!codes.length) return <Text tone="slate">None recorded</Text>;
  return (
    <Row wrap style={{ gap: t.space.xs }}>
      {codes.map((code) => (
        <Link key={code} href={`/codes/${encodeURIComponent(code.slice(0, 5))}` as Href} accessibilityLabel={`Code reference for ${code}`}>
          <View style={{ minHeight: t.layout.touchTarget, justifyContent: 'center' }}>
            <CodeChip code={code} />
          </View>
        </Link>
      ))}
    </Row>
  );
}

export function Tags({ tags }: { tags: string[] }) {
  const t = useTheme();
  if (!tags.length) return <Text tone="slate">None</Text>;
  return (
    <Row wrap style={{ gap: t.space.xs }}>
      {tags.map((tag) => (
        <View key={tag} style={{ backgroundColor: t.colour.sand, borderRadius: t.radius.pill, paddingHorizontal: t.space.sm, paddingVertical: t.space.xxs }}>
          <Text variant="small">{tag}</Text>
        </View>
      ))}
    </Row>
  );
}

export function CaseFacts({ c }: { c: CaseDetail }) {
  const t = useTheme();
  const v = c.vehicle;
  return (
    <Card style={{ gap: t.space.md }}>
      <Fact label="Trouble codes">
        <CodeLinks codes={c.codes} />
      </Fact>
      <Fact label="Platform">{platformName(c.platform)}</Fact>
      <Fact label="Vehicle">
        {v ? (
          <View style={{ gap: t.space.xxs }}>
            <Text mono selectable>VIN {v.vin}</Text>
            {v.plate ? <Text>Plate {v.plate}</Text> : null}
            {v.mileage != null ? <Text mono>{v.mileage.toLocaleString()} {v.mileageUnit ?? 'km'}</Text> : null}
            {c.visitDate ? <Text>Visit {shortDate(c.visitDate)}</Text> : null}
          </View>
        ) : (
          <Text tone="slate">No vehicle recorded</Text>
        )}
      </Fact>
      <Fact label="Symptoms">
        <Tags tags={c.symptoms} />
      </Fact>
    </Card>
  );
}

export function CauseAndFix({ c }: { c: CaseDetail }) {
  const t = useTheme();
  return (
    <Card style={{ gap: t.space.md }}>
      <Fact label="Root cause">{c.rootCause || 'Not written yet'}</Fact>
      <Fact label="Fix">{c.fix || 'Not written yet'}</Fact>
      <Fact label="Cause in the trees">
        {c.cause
          ? `${c.causeTitle ?? c.cause}${c.causeLinkedBy === 'suggestion' ? ' · linked by suggestion (edit the case to change it)' : ''}`
          : 'Not linked: edit the case and pick the cause, so the walk learns from this fix'}
      </Fact>
      {c.confirmation ? (
        <View style={{ gap: t.space.xs, padding: t.space.md, borderRadius: t.radius.md, backgroundColor: t.colour.mossFill }}>
          <Badge label="Fix confirmed" symbol="check" tone="moss" />
          <Text variant="small">
            by {c.confirmation.by.name}, {dateTime(c.confirmation.at)}
          </Text>
          {c.confirmation.note ? <Text serif>{c.confirmation.note}</Text> : null}
        </View>
      ) : (
        <Text variant="small" tone="slate">
          Fix not confirmed yet — a senior tech confirms it once the car has stayed fixed.
        </Text>
      )}
    </Card>
  );
}

const isImage = (a: Attachment) => a.mime.startsWith('image/');

export function AttachmentGallery({ attachments }: { attachments: Attachment[] }) {
  const t = useTheme();
  const images = attachments.filter(isImage);
  const files = attachments.filter((a) => !isImage(a));
  return (
    <View style={{ gap: t.space.sm }}>
      <Heading level={3}>Attachments</Heading>
      {attachments.length === 0 ? <Text tone="slate">No photos or files.</Text> : null}
      {images.length ? (
        <Row wrap style={{ gap: t.space.sm }}>
          {images.map((a) => (
            <Pressable key={a.id} role="link" accessibilityLabel={`Open ${a.name}`} onPress={() => void Linking.openURL(a.url)}>
              <Image source={{ uri: a.url }} accessibilityLabel={a.name} resizeMode="cover" style={{ width: 112, height: 112, borderRadius: t.radius.md, backgroundColor: t.colour.sand }} />
            </Pressable>
          ))}
        </Row>
      ) : null}
      {files.map((a) => (
        <Pressable key={a.id} role="link" accessibilityLabel={`Download ${a.name}`} onPress={() => void Linking.openURL(a.url)} style={{ minHeight: t.layout.touchTarget, justifyContent: 'center' }}>
          <Row>
            <Icon name="file" size={16} tone="tide" />
            <Text tone="tide" style={{ flexShrink: 1 }}>{a.name}</Text>
            <Text variant="small" tone="slate">
              {fileSize(a.size)} · {a.mime}
            </Text>
          </Row>
        </Pressable>
      ))}
    </View>
  );
}

const commentKinds: Record<CaseDetail['comments'][number]['kind'], { label: string; symbol: IconName }> = {
  comment: { label: 'Comment', symbol: 'edit' },
  returned: { label: 'Returned to the author', symbol: 'returned' },
  submitted: { label: 'Sent for review', symbol: 'next' },
  published: { label: 'Published', symbol: 'published' },
  confirmed: { label: 'Fix confirmed', symbol: 'check' },
};

export function CommentList({ comments }: { comments: CaseDetail['comments'] }) {
  const t = useTheme();
  if (!comments.length) return <Text tone="slate">No review comments yet.</Text>;
  return (
    <View style={{ gap: t.space.sm }}>
      {comments.map((c) => {
        const kind = commentKinds[c.kind];
        return (
          <View key={c.id} style={{ gap: t.space.xxs, borderLeftWidth: 3, borderColor: c.kind === 'returned' ? t.colour.amber : t.colour.line, paddingLeft: t.space.md }}>
            <Row style={{ gap: t.space.xs }}>
              <Icon name={kind.symbol} size={14} />
              <Text variant="small" weight="semibold">
                {kind.label} · {c.author.name}
              </Text>
            </Row>
            {/* Workflow entries often just repeat their label ("Published."); show the body only when it says more. */}
            {c.body && c.body.replace(/\.$/, '') !== kind.label ? <Text serif>{c.body}</Text> : null}
            <Text variant="caption" tone="slate">
              {dateTime(c.createdAt)}
            </Text>
          </View>
        );
      })}
    </View>
  );
}

export function RepeatVisits({ repeats }: { repeats: CaseDetail['repeats'] }) {
  const t = useTheme();
  if (!repeats.length) return null;
  return (
    <Card style={{ gap: t.space.sm }}>
      <Heading level={3}>Repeat visits</Heading>
      {repeats.map((r) => (
        <Link key={r.caseId} href={`/cases/${r.caseId}` as Href}>
          <View style={{ gap: t.space.xxs, minHeight: t.layout.touchTarget }}>
            <Row style={{ gap: t.space.xs }}>
              <Icon name="comeback" size={16} tone="tide" />
              <Text weight="semibold" tone="tide" style={{ flexShrink: 1 }}>
                {r.relation === 'came-back-as' ? `Came back ${r.days} days later` : `Comeback, ${r.days} days after`}: {r.title}
              </Text>
            </Row>
            <Text variant="small" tone="slate">
              {r.reason}
            </Text>
          </View>
        </Link>
      ))}
    </Card>
  );
}
