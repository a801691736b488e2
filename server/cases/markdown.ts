// Reads a case note: the trouble codes it mentions, readings with units and its headings. The note
// itself is stored as written; rendering is the client's job. The note is first bounded in nesting
// and in link openers per paragraph (shared/markdown/bound-note.ts), then read with markdown-it,
// whose passes are then linear in the note's length, so no note can hold the request thread for
// long (issue 15: remark took seconds on nested lists and overflowed the stack on 4,000 '>';
// markdown-it took a minute on "[a](" x 50,000).
import MarkdownIt from 'markdown-it';
import type { Token } from 'markdown-it';
import { findDtcsInText } from '../../shared/codes';
import { boundNote } from '../../shared/markdown/bound-note';
import { NOTE_MAX_NESTING } from '../../shared/markdown/nesting';
import type { NoteExtract } from '../../shared/schemas/cases';
import { findMeasurements } from '../../shared/units';

// html: true only so raw HTML arrives as html tokens and is left out of the text, as before.
// maxNesting is a second bound behind boundNoteNesting: a list level costs markdown-it two levels.
const parser = MarkdownIt({ html: true, linkify: false, typographer: false, maxNesting: 2 * NOTE_MAX_NESTING + 10 });

/** Text of one inline run: words, code spans and link texts; images and raw HTML are left out. */
function inlineText(token: Token): string {
  let text = '';
  let inImage = 0;
  for (const child of token.children ?? []) {
    if (child.type === 'image') inImage++;
    else if (child.type === 'text' || child.type === 'code_inline') text += inImage ? '' : child.content;
    else if (child.type === 'softbreak' || child.type === 'hardbreak') text += '\n';
  }
  return text;
}

/** Text runs of the note, one per block, so a reading never spans two table cells. */
function readBlocks(tokens: Token[]) {
  const runs: string[] = [];
  const headings: NoteExtract['headings'] = [];
  for (let i = 0; i < tokens.length; i++) {
    const token = tokens[i]!;
    if (token.type === 'code_block' || token.type === 'fence') runs.push(token.content);
    else if (token.type === 'inline') runs.push(inlineText(token));
    if (token.type === 'heading_open') {
      const inline = tokens[i + 1];
      headings.push({ depth: Number(token.tag.slice(1)), text: inline ? inlineText(inline).trim() : '' });
    }
  }
  return { runs, headings };
}

export function extractFromNote(body: string, caseCodes: string[] = []): NoteExtract {
  const bounded = boundNote(body);
  const { runs, headings } = readBlocks(parser.parse(bounded.text, {}));
  const codes = [...new Set(runs.flatMap((r) => findDtcsInText(r).map((d) => d.full)))];
  const known = new Set(caseCodes.flatMap((c) => [c, c.slice(0, 5)]));
  return {
    codes,
    suggestedCodes: codes.filter((c) => !known.has(c) && !known.has(c.slice(0, 5))),
    measurements: runs.flatMap((r) => findMeasurements(r)).map((m) => ({ value: m.value, unit: m.unit, raw: m.raw })),
    headings,
    markdownNotice: bounded.notice,
  };
}
