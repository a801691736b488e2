// Citations in test comments ("references.md §3") resolve to a section of docs/references.md.
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';

const root = path.resolve(import.meta.dirname, '../..');
const sections = new Set([...readFileSync(path.join(root, 'docs/references.md'), 'utf8').matchAll(/^## §(\d+) /gm)].map((m) => m[1]));

function citations(dir: string): { file: string; section: string }[] {
  return readdirSync(path.join(root, dir), { withFileTypes: true, recursive: true })
    .filter((e) => e.isFile() && /\.(ts|tsx)$/.test(e.name))
    .flatMap((e) => {
      const file = path.relative(root, path.join(e.parentPath, e.name));
      return [...readFileSync(path.join(root, file), 'utf8').matchAll(/references\.md,? §(\d+)/g)].map((m) => ({ file, section: m[1]! }));
    });
}

describe('docs/references.md', () => {
  it('has a section for every "references.md §N" that tests and code cite', () => {
    const cited = ['test', 'shared', 'server', 'features'].flatMap(citations);
    expect(cited.length).toBeGreaterThan(50);
    expect(cited.filter((c) => !sections.has(c.section)).map((c) => `${c.file} cites §${c.section}`)).toEqual([]);
  });
});
