import { readdirSync, readFileSync } from 'node:fs';
import MarkdownIt, { type Token } from 'markdown-it';
import { describe, expect, it } from 'vitest';
import { createNoteParser } from '../../features/markdown/note-parser';
import { boundNote } from '../../shared/markdown/bound-note';
import { boundLinkOpeners, NOTE_LINK_SCAN_BUDGET } from '../../shared/markdown/link-openers';

const NOTE_LIMIT = 200_000; // the note limit of shared/schemas/cases.ts
const fill = (unit: string) => unit.repeat(Math.floor(NOTE_LIMIT / unit.length));
const links = (tokens: Token[]) => tokens.flatMap((t) => t.children ?? []).filter((c) => c.type === 'link_open' || c.type === 'image').length;
const demoNotes = readdirSync('content/cases').filter((f) => f.endsWith('.md')).map((f) => readFileSync(`content/cases/${f}`, 'utf8'));

describe('bounding link openers in a case note (issue 15, markdown-it on "[a](" x 50,000)', () => {
  it('leaves an ordinary note with links untouched, the same string', () => {
    const note = 'See [the wiring page](https://example.test/wiring) and ![photo](attachment:3).\n\n```\n[not a link\n```\n- [x] done';
    expect(boundLinkOpeners(note)).toEqual({ text: note, escaped: 0 });
    expect(boundNote(note)).toEqual({ text: note, notice: null });
  });

  for (const unit of ['[a](', '![a](', '[', '[a]((', '[](', '\\\\[a](']) {
    it(`escapes most of "${unit}" repeated to the note limit, keeping the text, and says so`, () => {
      const note = fill(unit);
      const bound = boundNote(note);
      const escaped = boundLinkOpeners(note).escaped;
      // only backslashes were added, one per escaped '['
      expect(bound.text.length).toBe(note.length + escaped);
      expect(bound.text.replaceAll('\\', '')).toBe(note.replaceAll('\\', ''));
      expect(bound.notice).toMatch(/shown as plain text\. The note is stored as written\.$/);
      // the budget is spent within a few dozen openers of a 200,000 character paragraph
      expect(escaped).toBeGreaterThan((note.match(/\[/g)?.length ?? 0) - 100);
      createNoteParser().parse(bound.text, {}); // returns (the test timeout is the bound)
    });
  }

  it('keeps every link of the demo notes, also repeated to the note limit, and of a long link-heavy paragraph', () => {
    let demo = demoNotes.join('\n\n');
    while (demo.length < NOTE_LIMIT) demo += '\n\n' + demo;
    demo = demo.slice(0, NOTE_LIMIT);
    const linkHeavy = ('Per [the wiring page](https://example.test/wiring) and [photo](attachment:1). ' + 'Words here. '.repeat(30) + '\n').repeat(400).slice(0, NOTE_LIMIT);
    for (const note of [demo, linkHeavy]) {
      expect(boundLinkOpeners(note, NOTE_LINK_SCAN_BUDGET / 10).escaped).toBe(0);
    }
    expect(links(MarkdownIt().parse(boundNote(linkHeavy).text, {}))).toBe(800);
  });

  it('does not count escaped brackets, counts brackets after an escaped backslash, and leaves fenced code alone', () => {
    expect(boundLinkOpeners('\\[x '.repeat(1000), 10).escaped).toBe(0);
    expect(boundLinkOpeners('\\\\[x '.repeat(1000), 10).escaped).toBeGreaterThan(990);
    const fenced = '```\n' + '[a]('.repeat(1000) + '\n```';
    expect(boundLinkOpeners(fenced, 10)).toEqual({ text: fenced, escaped: 0 });
  });

  it('combines with the nesting notice in one message', () => {
    expect(boundNote('- '.repeat(30) + '[a]('.repeat(50_000)).notice).toMatch(/flattened to 20 levels\. This note has more brackets .* shown as plain text\. The note is stored as written\.$/);
  });
});
