// Case notes rendered with react-native-markdown-display, styled by the theme: Source Serif 4 for
// reading (real bold and italic files), no raw HTML, strict links, images only from the case's attachments.
import { useMemo, type ReactNode } from 'react';
import { Image, Linking, View } from 'react-native';
import Markdown, { renderRules as packageRules, type ASTNode, type RenderRules } from 'react-native-markdown-display';
import { boundNote } from '../../shared/markdown/bound-note';
import { useTheme, type Theme } from '../theme/use-theme';
import { Notice } from '../ui/notice';
import { Text } from '../ui/text';
import { isCautionQuote, type NoteNode } from './caution';
import { createNoteParser } from './note-parser';
import { safeImageSrc, safeLinkHref } from './safety';
import { Icon } from '../ui/icon';

const parser = createNoteParser();

function noteStyles(t: Theme) {
  const c = t.colour;
  const heading = { fontFamily: t.fonts.serifSemiBold, fontWeight: 'normal' as const, color: c.ink, marginTop: t.space.lg, marginBottom: t.space.xs };
  return {
    body: { fontFamily: t.fonts.serif, ...t.type.body, color: c.ink },
    heading1: { ...heading, ...t.type.display, marginTop: t.space.sm },
    heading2: { ...heading, ...t.type.title },
    heading3: { ...heading, ...t.type.lead },
    heading4: { ...heading, ...t.type.body },
    heading5: { ...heading, ...t.type.body },
    heading6: { ...heading, ...t.type.body },
    paragraph: { marginTop: 0, marginBottom: t.space.md, flexWrap: 'wrap' as const, flexDirection: 'row' as const, alignItems: 'flex-start' as const },
    strong: { fontFamily: t.fonts.serifBold, fontWeight: 'normal' as const },
    em: { fontFamily: t.fonts.serifItalic, fontStyle: 'normal' as const },
    s: { textDecorationLine: 'line-through' as const },
    link: { color: c.tide, textDecorationLine: 'underline' as const },
    blockquote: { backgroundColor: c.sand, borderColor: c.line, borderLeftWidth: 4, marginLeft: 0, paddingHorizontal: t.space.md, paddingTop: t.space.sm, marginBottom: t.space.md, borderRadius: t.radius.sm },
    bullet_list: { marginBottom: t.space.md },
    ordered_list: { marginBottom: t.space.md },
    list_item: { marginBottom: t.space.xs },
    bullet_list_icon: { marginLeft: t.space.xs, marginRight: t.space.sm, color: c.slate },
    ordered_list_icon: { marginLeft: t.space.xs, marginRight: t.space.sm, color: c.slate, fontVariant: ['tabular-nums' as const] },
    // The package's defaults give inline code a border and 10 px padding, which breaks the line height.
    code_inline: { fontFamily: t.fonts.mono, backgroundColor: c.sand, color: c.ink, borderRadius: t.radius.sm, borderWidth: 0, padding: 0, paddingHorizontal: t.space.xxs, fontSize: t.type.small.fontSize },
    code_block: { fontFamily: t.fonts.mono, backgroundColor: c.sand, color: c.ink, padding: t.space.md, borderRadius: t.radius.md, borderWidth: 0, marginBottom: t.space.md, ...t.type.small },
    fence: { fontFamily: t.fonts.mono, backgroundColor: c.sand, color: c.ink, padding: t.space.md, borderRadius: t.radius.md, borderWidth: 0, marginBottom: t.space.md, ...t.type.small },
    table: { borderWidth: 1, borderColor: c.line, borderRadius: t.radius.sm, marginBottom: t.space.md, backgroundColor: c.card },
    thead: { backgroundColor: c.sand },
    tr: { borderBottomWidth: 1, borderColor: c.line, flexDirection: 'row' as const },
    th: { flex: 1, padding: t.space.sm, fontFamily: t.fonts.sans, fontWeight: '600' as const, ...t.type.small },
    td: { flex: 1, padding: t.space.sm, fontFamily: t.fonts.sans, ...t.type.small, fontVariant: ['tabular-nums' as const] },
    hr: { backgroundColor: c.line, height: 1, marginVertical: t.space.lg },
    image: { marginBottom: t.space.md },
  };
}

interface AttachmentRef {
  id: number;
  name: string;
}

function rules(t: Theme, attachmentIds: ReadonlySet<number>): RenderRules {
  return {
    link: (node, children, _parents, styles) => {
      const href = safeLinkHref(node.attributes.href as string | undefined);
      if (!href) return <Text key={node.key}>{children}</Text>;
      return (
        <Text key={node.key} role="link" style={styles.link} onPress={() => void Linking.openURL(href)}>
          {children}
        </Text>
      );
    },
    blocklink: (node, children) => (
      <View key={node.key}>{children}</View>
    ),
    image: (node) => {
      const alt = String(node.attributes.alt ?? '');
      const src = safeImageSrc(node.attributes.src as string | undefined, attachmentIds);
      if (!src)
        return (
          <Text key={node.key} variant="small" tone="slate">
            [picture not shown{alt ? `: ${alt}` : ''} — only this case&apos;s own attachments are shown]
          </Text>
        );
      return <Image key={node.key} source={{ uri: src }} accessibilityLabel={alt || 'Attachment'} resizeMode="contain" style={{ width: '100%', height: 260, borderRadius: t.radius.md, backgroundColor: t.colour.sand, marginBottom: t.space.md }} />;
    },
    blockquote: (node, children, _parents, styles) => {
      if (!isCautionQuote(node as unknown as NoteNode)) return <View key={node.key} style={styles._VIEW_SAFE_blockquote}>{children}</View>;
      return (
        <View
          key={node.key}
          role="note"
          aria-label="Caution"
          style={{ flexDirection: 'row', gap: t.space.sm, padding: t.space.md, paddingBottom: 0, marginBottom: t.space.md, borderRadius: t.radius.md, borderLeftWidth: 4, borderColor: t.colour.amber, backgroundColor: t.colour.amberFill }}
        >
          <View style={{ paddingTop: 2 }}>
            <Icon name="warning" tone="amber" />
          </View>
          <View style={{ flex: 1 }}>{children}</View>
        </View>
      );
    },
    list_item: (node, children, parents, styles, inherited) => {
      const task = (node as ASTNode).attributes['data-task'] as string | undefined;
      if (!task) return defaultListItem(node, children, parents, styles, inherited);
      const done = task === 'done';
      return (
        <View key={node.key} role="checkbox" aria-checked={done} aria-readonly style={{ flexDirection: 'row', gap: t.space.sm, marginBottom: t.space.xs }}>
          <View style={{ width: 20, paddingTop: 2 }}>
            <Icon name={done ? 'ticked' : 'unticked'} size={16} tone={done ? 'moss' : 'slate'} />
          </View>
          <View style={{ flex: 1 }}>{children}</View>
        </View>
      );
    },
  };
}

// The package's own list_item rule, for ordinary bullets and numbers.
const defaultListItem = (...args: Parameters<NonNullable<RenderRules['list_item']>>): ReactNode => packageRules.list_item!(...args);

export function MarkdownView({ body, attachments = [] }: { body: string; attachments?: readonly AttachmentRef[] }) {
  const t = useTheme();
  const ids = useMemo(() => new Set(attachments.map((a) => a.id)), [attachments]);
  const style = useMemo(() => noteStyles(t), [t.scheme]); // eslint-disable-line react-hooks/exhaustive-deps
  const renderRules = useMemo(() => rules(t, ids), [t.scheme, ids]); // eslint-disable-line react-hooks/exhaustive-deps
  // The same bounds as the server's reading of the note: deep nesting or thousands of '[' would freeze the page.
  const bounded = useMemo(() => boundNote(body), [body]);
  const notice = bounded.notice;
  if (!body.trim()) return <Text tone="slate">Nothing written yet.</Text>;
  return (
    <View style={{ maxWidth: t.layout.readingWidth, gap: notice ? t.space.md : 0 }}>
      {notice ? <Notice tone="info">{notice}</Notice> : null}
      <Markdown markdownit={parser} style={style} rules={renderRules}>
        {bounded.text}
      </Markdown>
    </View>
  );
}
