// Toolbar insertions for the note editor: each puts Markdown syntax at the cursor and says where the cursor goes next.

export type SyntaxKind = 'heading' | 'list' | 'checklist' | 'table' | 'code';
export interface Selection {
  start: number;
  end: number;
}
export interface Edit {
  text: string;
  selection: Selection;
}

const TABLE = '| Test | Reading | Spec |\n| --- | --- | --- |\n|  |  |  |\n';
const LINE_PREFIX: Partial<Record<SyntaxKind, string>> = { heading: '## ', list: '- ', checklist: '- [ ] ' };

function clamp(sel: Selection, length: number): Selection {
  const start = Math.max(0, Math.min(sel.start, length));
  return { start, end: Math.max(start, Math.min(sel.end, length)) };
}

/** Block syntax needs its own line: a newline before it unless the cursor already starts one. */
function blockBreak(text: string, at: number): string {
  if (at === 0) return '';
  return text.charAt(at - 1) === '\n' ? (text.charAt(at - 2) === '\n' || at === 1 ? '' : '\n') : '\n\n';
}

export function insertSyntax(text: string, selection: Selection, kind: SyntaxKind): Edit {
  const { start, end } = clamp(selection, text.length);
  const before = text.slice(0, start);
  const picked = text.slice(start, end);
  const after = text.slice(end);
  const prefix = LINE_PREFIX[kind];
  if (prefix) {
    const lineStart = before.lastIndexOf('\n') + 1;
    const lines = text.slice(lineStart, end).split('\n').map((line) => prefix + line);
    const replaced = lines.join('\n');
    const out = text.slice(0, lineStart) + replaced + after;
    // The cursor keeps its place in the text, moved on by the markers inserted before it.
    const cursor = end + prefix.length * lines.length;
    return { text: out, selection: { start: cursor, end: cursor } };
  }
  if (kind === 'code') {
    if (picked && !picked.includes('\n')) {
      const out = `${before}\`${picked}\`${after}`;
      return { text: out, selection: { start: start + 1, end: end + 1 } };
    }
    const lead = blockBreak(text, start);
    const block = `${lead}\`\`\`\n${picked}`;
    const out = `${before}${block}\n\`\`\`\n${after}`;
    const cursor = start + block.length;
    return { text: out, selection: { start: cursor, end: cursor } };
  }
  const lead = blockBreak(text, start);
  const out = `${before}${lead}${TABLE}${after}`;
  // Put the cursor in the first empty cell.
  const cursor = start + lead.length + TABLE.indexOf('|  |') + 2;
  return { text: out, selection: { start: cursor, end: cursor } };
}
