// Icons come from the bundled set (features/ui/icon.tsx), never from Unicode symbols, which
// every phone draws differently (or not at all). Typographic marks in prose (— · “ ”) are fine.
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { ICONS } from '../../../features/ui/icon-names';

const root = path.resolve(import.meta.dirname, '../../..');
// Arrows, geometric shapes, dingbats, misc symbols and technical symbols.
const SYMBOL = /[\u2190-\u21FF\u2300-\u23FF\u25A0-\u25FF\u2600-\u27BF\u2B00-\u2BFF]/u;

function sourceFiles(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true, recursive: true })
    .filter((e) => e.isFile() && /\.tsx?$/.test(e.name))
    .map((e) => path.join(e.parentPath, e.name));
}

describe('icons', () => {
  it('no screen draws a Unicode symbol as an icon', () => {
    const offenders: string[] = [];
    for (const file of [...sourceFiles(path.join(root, 'features')), ...sourceFiles(path.join(root, 'app'))]) {
      readFileSync(file, 'utf8')
        .split('\n')
        .forEach((line, i) => {
          const code = line.replace(/\/\/.*$|\/\*.*?\*\/|^\s*\*.*$/g, '');
          if (SYMBOL.test(code)) offenders.push(`${path.relative(root, file)}:${i + 1}: ${line.trim()}`);
        });
    }
    expect(offenders).toEqual([]);
  });

  it('every icon name maps to a glyph of the bundled set', async () => {
    const glyphs = JSON.parse(readFileSync(path.join(root, 'node_modules/@expo/vector-icons/build/vendor/react-native-vector-icons/glyphmaps/Feather.json'), 'utf8')) as Record<string, number>;
    expect(Object.values(ICONS).filter((g) => !(g in glyphs))).toEqual([]);
  });
});
