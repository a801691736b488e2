import { describe, expect, it } from 'vitest';
import MarkdownIt from 'markdown-it';
import { createNoteParser } from '../../features/markdown/note-parser';
import { boundNoteNesting, nestingNotice, NOTE_MAX_NESTING } from '../../shared/markdown/nesting';

const NOTE_LIMIT = 200_000; // the note limit of shared/schemas/cases.ts
const fill = (unit: string) => unit.repeat(Math.floor(NOTE_LIMIT / unit.length));
const md = MarkdownIt();

/** The deepest list / quote nesting markdown-it builds for a text (each list level opens a list and an item). */
function parsedDepth(text: string): number {
  let level = 0;
  let deepest = 0;
  for (const token of md.parse(text, {})) {
    if (token.type === 'blockquote_open' || token.type === 'bullet_list_open' || token.type === 'ordered_list_open') deepest = Math.max(deepest, ++level);
    if (token.type === 'blockquote_close' || token.type === 'bullet_list_close' || token.type === 'ordered_list_close') level--;
  }
  return deepest;
}

describe('bounding the nesting of a case note (issue 15, finding 1)', () => {
  it('leaves an ordinary note untouched, the same string', () => {
    const note = '## Tests\n- Boost `15 psi`\n  - held for 10 s\n> **Caution:** hot exhaust\n\n1. Scan\n2. Fix';
    const bound = boundNoteNesting(note);
    expect(bound).toEqual({ text: note, cutLines: 0, deepest: 2 });
    expect(nestingNotice(bound)).toBeNull();
  });

  for (const [name, unit] of [['"- "', '- '], ['"1. "', '1. '], ['">"', '>'], ['"* "', '* '], ['"+ "', '+ '], ['"1) "', '1) '], ['mixed "> - 1. "', '> - 1. ']] as const) {
    it(`flattens ${name} repeated up to the 200,000 character note limit to ${NOTE_MAX_NESTING} levels and says so`, () => {
      const note = fill(unit) + 'P0300 seen';
      const bound = boundNoteNesting(note);
      expect(bound.cutLines).toBe(1);
      expect(bound.deepest).toBeGreaterThan(NOTE_MAX_NESTING);
      expect(bound.text.endsWith('P0300 seen')).toBe(true);
      expect(parsedDepth(bound.text)).toBeLessThanOrEqual(NOTE_MAX_NESTING);
      expect(nestingNotice(bound)).toMatch(/flattened to 20 levels.*stored as written/);
    });
  }

  it('flattens every deep line of a note made of many of them', () => {
    const note = ('- '.repeat(25) + 'x\n').repeat(3_000) + ('> '.repeat(30) + 'y\n').repeat(1_000);
    const bound = boundNoteNesting(note);
    expect(bound.cutLines).toBe(4_000);
    expect(bound.deepest).toBe(30);
    expect(parsedDepth(bound.text)).toBeLessThanOrEqual(NOTE_MAX_NESTING);
    expect(bound.text.split('\n').filter((l) => l.endsWith('x')).length).toBe(3_000);
  });

  it('limits nesting built from indentation, one level per line', () => {
    let note = '';
    for (let depth = 0; note.length < NOTE_LIMIT - 500; depth++) note += ' '.repeat(2 * depth) + '- item\n';
    const bound = boundNoteNesting(note);
    expect(bound.deepest).toBeGreaterThan(100);
    expect(parsedDepth(bound.text)).toBeLessThanOrEqual(NOTE_MAX_NESTING + 1);
    expect(bound.text.split('\n').filter((l) => l.includes('- item')).length).toBe(note.split('\n').length - 1);
  });

  it('gives the client renderer (the case screen\'s markdown-it) the bounded note, keeping the text after the cut', () => {
    const tokens = createNoteParser().parse(boundNoteNesting(fill('> - 1. ') + 'P0300 seen').text, {});
    const opened = tokens.filter((token) => token.type.endsWith('_open') && token.type !== 'paragraph_open').length;
    expect(opened).toBeLessThanOrEqual(2 * NOTE_MAX_NESTING);
    expect(tokens.some((token) => token.type === 'inline' && token.content === 'P0300 seen')).toBe(true);
  });

  it('keeps lines inside a fenced code block as written', () => {
    const deep = '> '.repeat(30) + 'quoted log line';
    const note = '```\n' + deep + '\n```\n' + deep;
    const lines = boundNoteNesting(note).text.split('\n');
    expect(lines[1]).toBe(deep);
    expect(lines[3]).toBe('> '.repeat(NOTE_MAX_NESTING) + 'quoted log line');
  });

  it('does not take an indented code block for a fence', () => {
    const note = '    ```\n' + '- '.repeat(40) + 'x';
    expect(boundNoteNesting(note).cutLines).toBe(1);
  });
});
