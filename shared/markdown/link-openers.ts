// Bounds the link and image openers ('[') of a note before any Markdown parser sees it. The
// markdown-it we ship (10.0) scans from a '[' to its ']' and, when "](" follows, on through the
// link destination until a space, line end or ')'; links that never close make that quadratic, so
// "[a](" repeated 50,000 times (200 KB) held the server for about a minute. Each '[' is charged
// what such a scan would read (a linear estimate); once the note's budget is spent, a '[' is
// escaped ('\[') and shows as the character it is. Pure, like nesting.ts: the server's extraction
// and the client's renderer read the same bounded text.
import { eachLineOutsideFences } from './nesting';

/**
 * Characters markdown-it may scan for links in one note (common practice, no source): the demo
 * notes repeated up to the 200,000-character limit need about 6,000, a 200,000-character paragraph
 * with two links a line about 29,000 (measured; test/shared/link-openers.test.ts keeps them inside).
 */
export const NOTE_LINK_SCAN_BUDGET = 1_000_000;

export interface BoundedLinks {
  text: string;
  /** How many '[' were escaped. */
  escaped: number;
}

const isBlank = (line: string) => line.trim() === '';
const endsDestination = (c: string) => c <= ' ' || c === ')' || c === '\x7f';

/** For each position, where the next character matching `is` sits (text.length when none). */
function nextIndex(text: string, is: (c: string) => boolean): Int32Array {
  const next = new Int32Array(text.length + 1).fill(text.length);
  for (let i = text.length - 1; i >= 0; i--) next[i] = is(text[i]!) ? i : next[i + 1]!;
  return next;
}

/** Escapes the '[' of one paragraph past the budget; returns the text and what it spent. */
function boundParagraph(text: string, budgetLeft: number): { text: string; spent: number; escaped: number } {
  const nextClose = nextIndex(text, (c) => c === ']');
  const nextStop = nextIndex(text, endsDestination);
  let spent = 0;
  let escaped = 0;
  let out = '';
  let from = 0;
  for (let i = 0; i < text.length; i++) {
    if (text[i] === '\\') i++; // an escaped character, whatever it is, opens nothing
    else if (text[i] === '[') {
      const close = nextClose[i]!;
      spent += close - i + (text[close + 1] === '(' ? nextStop[Math.min(close + 2, text.length)]! - close : 0);
      if (spent <= budgetLeft) continue;
      out += text.slice(from, i) + '\\';
      from = i;
      escaped++;
    }
  }
  return { text: from ? out + text.slice(from) : text, spent, escaped };
}

export function boundLinkOpeners(body: string, budget = NOTE_LINK_SCAN_BUDGET): BoundedLinks {
  if (!body.includes('[')) return { text: body, escaped: 0 };
  // Paragraphs: runs of lines outside fences, ended by a blank line or a fence.
  const lines = body.split('\n');
  const paragraphs: number[][] = [];
  let last = -2;
  eachLineOutsideFences(body, (line, n) => {
    if (isBlank(line)) return;
    if (n !== last + 1 || !paragraphs.length) paragraphs.push([]);
    paragraphs.at(-1)!.push(n);
    last = n;
  });
  let left = budget;
  let escaped = 0;
  for (const paragraph of paragraphs) {
    const text = paragraph.map((n) => lines[n]).join('\n');
    if (!text.includes('[')) continue;
    const bound = boundParagraph(text, left);
    left -= bound.spent;
    if (!bound.escaped) continue;
    escaped += bound.escaped;
    bound.text.split('\n').forEach((line, k) => (lines[paragraph[k]!] = line));
  }
  return { text: escaped ? lines.join('\n') : body, escaped };
}

/** What was escaped, in one sentence, or null when nothing was. */
export function linkOpenersSentence(bound: BoundedLinks): string | null {
  if (!bound.escaped) return null;
  const count = bound.escaped === 1 ? '1 "[" is' : `${bound.escaped.toLocaleString('en-GB')} "[" are`;
  return `This note has more brackets than can be read as links in reasonable time; ${count} shown as plain text.`;
}
