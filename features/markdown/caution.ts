// A blockquote that opens with **Caution:** is a safety caution, drawn in the Caution style.

export interface NoteNode {
  type: string;
  content?: string;
  children: NoteNode[];
}

export function textOf(node: NoteNode): string {
  return (node.content ?? '') + node.children.map(textOf).join('');
}

/** The first inline node that carries text (skips paragraph/textgroup wrappers). */
function firstInline(node: NoteNode): NoteNode | undefined {
  let current: NoteNode | undefined = node.children[0];
  while (current && (current.type === 'paragraph' || current.type === 'textgroup' || current.type === 'inline')) current = current.children[0];
  return current;
}

/** True when the quote starts with bold "Caution:" (the colon inside or just after the bold). */
export function isCautionQuote(node: NoteNode): boolean {
  if (node.type !== 'blockquote') return false;
  const first = firstInline(node);
  if (first?.type !== 'strong') return false;
  return /^\s*caution\s*:?\s*$/i.test(textOf(first));
}
