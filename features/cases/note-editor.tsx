// The Markdown text area with its toolbar; each button inserts syntax at the cursor.
import { useRef, useState } from 'react';
import { TextInput, View } from 'react-native';
import { insertSyntax, type Selection, type SyntaxKind } from '../markdown/editing';
import { useTheme } from '../theme/use-theme';
import { Button } from '../ui/button';
import { Row } from '../ui/surfaces';
import { Text } from '../ui/text';
import type { IconName } from '../ui/icon';

const tools: { kind: SyntaxKind; label: string; icon: IconName }[] = [
  { kind: 'heading', label: 'Heading', icon: 'heading' },
  { kind: 'list', label: 'List', icon: 'list' },
  { kind: 'checklist', label: 'Checklist', icon: 'checklist' },
  { kind: 'table', label: 'Table', icon: 'table' },
  { kind: 'code', label: 'Code', icon: 'codeBlock' },
];

export function NoteEditor({ value, onChange, error, insertRef }: { value: string; onChange: (v: string) => void; error?: string; insertRef?: React.MutableRefObject<((text: string) => void) | null> }) {
  const t = useTheme();
  const selection = useRef<Selection>({ start: value.length, end: value.length });
  const input = useRef<TextInput | null>(null);
  // On the web the input is the DOM textarea: its own selection is the truth (typing and filling do not always report one).
  const cursor = (): Selection => {
    const node = input.current as unknown as { selectionStart?: unknown; selectionEnd?: unknown } | null;
    return typeof node?.selectionStart === 'number' && typeof node.selectionEnd === 'number' ? { start: node.selectionStart, end: node.selectionEnd } : selection.current;
  };
  const [forced, setForced] = useState<Selection | undefined>();
  const apply = (text: string, sel: Selection) => {
    onChange(text);
    selection.current = sel;
    setForced(sel);
    // Back to the text so typing carries on where the syntax went in.
    setTimeout(() => input.current?.focus(), 0);
  };
  const insert = (kind: SyntaxKind) => {
    const edit = insertSyntax(value, cursor(), kind);
    apply(edit.text, edit.selection);
  };
  if (insertRef)
    insertRef.current = (snippet: string) => {
      const at = cursor().end;
      const text = value.slice(0, at) + snippet + value.slice(at);
      apply(text, { start: at + snippet.length, end: at + snippet.length });
    };
  return (
    <View style={{ gap: t.space.xs }}>
      <Text nativeID="note-label" variant="small" weight="semibold">
        Note (Markdown)
      </Text>
      <Row wrap role="toolbar" aria-label="Formatting" style={{ gap: t.space.xs }}>
        {tools.map((tool) => (
          <Button key={tool.kind} kind="secondary" compact label={tool.label} icon={tool.icon} onPress={() => insert(tool.kind)} />
        ))}
      </Row>
      <TextInput
        ref={input}
        aria-labelledby="note-label"
        accessibilityLabel="Note (Markdown)"
        aria-invalid={Boolean(error)}
        multiline
        value={value}
        selection={forced}
        onSelectionChange={(e) => {
          selection.current = e.nativeEvent.selection;
          if (forced) setForced(undefined);
        }}
        onChangeText={(text) => {
          if (forced) setForced(undefined);
          onChange(text);
        }}
        placeholder={'What the car did, what you tested (with readings), what you found.\n\n> **Caution:** for work that can hurt someone.'}
        placeholderTextColor={t.colour.slate}
        style={[
          t.type.body,
          {
            minHeight: 360,
            padding: t.space.md,
            borderWidth: 1.5,
            borderRadius: t.radius.md,
            borderColor: error ? t.colour.brick : t.colour.line,
            backgroundColor: t.colour.card,
            color: t.colour.ink,
            fontFamily: t.fonts.mono,
            textAlignVertical: 'top',
          },
        ]}
      />
      {error ? (
        <Text variant="small" tone="brick" role="alert">
          {error}
        </Text>
      ) : null}
    </View>
  );
}
