import { describe, expect, it } from 'vitest';
import type { Token } from 'markdown-it';
import { isCautionQuote, type NoteNode } from '../../../features/markdown/caution';
import { createNoteParser } from '../../../features/markdown/note-parser';
import { acceptableUrl, attachmentIdFromUrl, safeImageSrc, safeLinkHref } from '../../../features/markdown/safety';

const md = createNoteParser();
const flat = (tokens: Token[]): Token[] => tokens.flatMap((t) => [t, ...flat(t.children ?? [])]);
const parse = (src: string) => flat(md.parse(src, {}));
const types = (src: string) => parse(src).map((t) => t.type);

describe('links in case notes', () => {
  it('keeps http, https and mailto links', () => {
    expect(safeLinkHref('https://example.com/a?b=1')).toBe('https://example.com/a?b=1');
    expect(safeLinkHref('http://example.com')).toBe('http://example.com');
    expect(safeLinkHref('mailto:desk@shop.test')).toBe('mailto:desk@shop.test');
  });

  it('drops javascript, data, vbscript, file and relative links, including disguised schemes', () => {
    for (const href of ['javascript:alert(1)', 'JaVaScRiPt:alert(1)', 'java\tscript:alert(1)', ' javascript:alert(1)', '\u0000javascript:x', 'data:text/html,<b>x</b>', 'vbscript:x', 'file:///etc/passwd', '/cases/2', '//evil.test/x', 'https:/x', '']) {
      expect(safeLinkHref(href), href).toBeNull();
    }
  });

  it('renders a javascript: link as plain text: the parser makes no link token for it', () => {
    const tokens = parse('[x](javascript:alert(1))');
    expect(tokens.some((t) => t.type === 'link_open')).toBe(false);
    expect(tokens.filter((t) => t.type === 'text').map((t) => t.content).join('')).toContain('javascript:alert(1)');
  });

  it('makes a link token for an https link', () => {
    const link = parse('[manual](https://example.com/m)').find((t) => t.type === 'link_open');
    expect(link?.attrGet('href')).toBe('https://example.com/m');
  });
});

describe('images in case notes', () => {
  const ids = new Set([7, 12]);

  it('shows only this case’s own attachments', () => {
    expect(safeImageSrc('/api/attachments/7', ids)).toBe('/api/attachments/7');
    expect(safeImageSrc('/api/attachments/8', ids)).toBeNull();
    expect(safeImageSrc('https://example.com/p.png', ids)).toBeNull();
    expect(safeImageSrc('/api/attachments/7/../../x', ids)).toBeNull();
    expect(safeImageSrc('data:image/png;base64,AAAA', ids)).toBeNull();
  });

  it('reads the attachment id only from the exact path', () => {
    expect(attachmentIdFromUrl('/api/attachments/12')).toBe(12);
    expect(attachmentIdFromUrl('/api/attachments/0')).toBeNull();
    expect(attachmentIdFromUrl('https://other.test/api/attachments/12')).toBeNull();
    expect(attachmentIdFromUrl('/api/attachments/12?x=1')).toBeNull();
  });

  it('lets the parser keep attachment and https image URLs for the render rule to judge, and nothing else', () => {
    expect(acceptableUrl('/api/attachments/3')).toBe(true);
    expect(acceptableUrl('https://example.com/p.png')).toBe(true);
    expect(acceptableUrl('data:image/png;base64,AAAA')).toBe(false);
    expect(types('![p](data:image/png;base64,AAAA)')).not.toContain('image');
  });
});

describe('raw HTML in case notes', () => {
  it('is text, never an HTML token (markdown-it html: false)', () => {
    const src = '<script>alert(1)</script>\n\nHello <img src=x onerror=alert(1)> there <b>bold</b>';
    const tokens = parse(src);
    expect(tokens.some((t) => t.type === 'html_block' || t.type === 'html_inline')).toBe(false);
    expect(tokens.filter((t) => t.type === 'text').map((t) => t.content).join('')).toContain('<script>alert(1)</script>');
    expect(md.options.html).toBe(false);
  });
});

describe('GFM in case notes', () => {
  it('parses a table (GFM spec 0.29-gfm, tables extension, example 198)', () => {
    const t = types('| foo | bar |\n| --- | --- |\n| baz | bim |\n');
    expect(t).toContain('table_open');
    expect(t.filter((x) => x === 'th_open')).toHaveLength(2);
    expect(t.filter((x) => x === 'td_open')).toHaveLength(2);
  });

  it('marks task list items and strips the marker (GFM spec 0.29-gfm, task list items extension, example 279)', () => {
    const tokens = parse('- [ ] foo\n- [x] bar\n');
    const items = tokens.filter((t) => t.type === 'list_item_open').map((t) => t.attrGet('data-task'));
    expect(items).toEqual(['open', 'done']);
    const texts = tokens.filter((t) => t.type === 'text').map((t) => t.content);
    expect(texts).toEqual(['foo', 'bar']);
  });

  it('marks nested task items too (GFM spec 0.29-gfm, example 280)', () => {
    const tokens = parse('- [x] foo\n  - [ ] bar\n  - [x] baz\n- [ ] bim\n');
    expect(tokens.filter((t) => t.type === 'list_item_open').map((t) => t.attrGet('data-task'))).toEqual(['done', 'open', 'done', 'open']);
  });

  it('leaves an ordinary bullet that merely mentions brackets alone', () => {
    const tokens = parse('- [link](https://example.com) here\n- [y] not a task\n');
    expect(tokens.filter((t) => t.type === 'list_item_open').map((t) => t.attrGet('data-task'))).toEqual([null, null]);
  });
});

describe('cautions in case notes', () => {
  const node = (type: string, children: NoteNode[] = [], content = ''): NoteNode => ({ type, children, content });
  const quote = (first: NoteNode) => node('blockquote', [node('paragraph', [node('textgroup', [first, node('text', [], ' keep clear of the fan.')])])]);

  it('recognises a blockquote that opens with bold Caution:', () => {
    expect(isCautionQuote(quote(node('strong', [node('text', [], 'Caution:')])))).toBe(true);
    expect(isCautionQuote(quote(node('strong', [node('text', [], 'Caution')])))).toBe(true);
  });

  it('leaves other quotes as quotes', () => {
    expect(isCautionQuote(quote(node('text', [], 'Caution: plain')))).toBe(false);
    expect(isCautionQuote(quote(node('strong', [node('text', [], 'Note:')])))).toBe(false);
    expect(isCautionQuote(node('paragraph', [node('strong', [node('text', [], 'Caution:')])]))).toBe(false);
  });
});
