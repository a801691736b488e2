import { describe, expect, it } from 'vitest';
import { escapeHtml } from '../../shared/html';

describe('escapeHtml', () => {
  it('escapes the five characters that can end text or a quoted attribute, ampersand first', () => {
    expect(escapeHtml(`<a href="x" title='y'>Tom & Jerry</a>`)).toBe('&lt;a href=&quot;x&quot; title=&#39;y&#39;&gt;Tom &amp; Jerry&lt;/a&gt;');
  });

  it('escapes an entity typed as text, and leaves plain text alone', () => {
    expect(escapeHtml('&amp;')).toBe('&amp;amp;');
    expect(escapeHtml('plain text, 12.5 V')).toBe('plain text, 12.5 V');
  });
});
