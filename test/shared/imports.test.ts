// The layering of DEVELOPERS.md and package.json, checked by reading every import: db/ and
// shared/ stay below server/, and every package the code imports is declared.
import { builtinModules } from 'node:module';
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';

const root = path.resolve(import.meta.dirname, '../..');
const pkg = JSON.parse(readFileSync(path.join(root, 'package.json'), 'utf8')) as { dependencies: Record<string, string>; devDependencies: Record<string, string> };

const thisFile = path.relative(root, import.meta.filename);

/** Code files under dir (this test's own example imports excluded). */
function sourceFiles(dir: string): string[] {
  return readdirSync(path.join(root, dir), { withFileTypes: true, recursive: true })
    .filter((e) => e.isFile() && /\.(ts|tsx|mjs|js)$/.test(e.name) && !e.name.endsWith('.d.ts'))
    .map((e) => path.relative(root, path.join(e.parentPath, e.name)))
    .filter((file) => file !== thisFile);
}

/** Module specifiers of static imports and exports, dynamic import() and require(). */
export function importsOf(source: string): string[] {
  const found: string[] = [];
  const patterns = [/^\s*(?:import|export)\s[^'";]*?\bfrom\s*['"]([^'"]+)['"]/gm, /^\s*import\s*['"]([^'"]+)['"]/gm, /\b(?:import|require)\s*\(\s*['"]([^'"]+)['"]\s*\)/g];
  for (const pattern of patterns) for (const m of source.matchAll(pattern)) found.push(m[1]!);
  return found;
}

/** The repository folder a relative import of `file` lands in (first path segment), or null for a package. */
function targetFolder(file: string, specifier: string): string | null {
  if (specifier.startsWith('@/')) return specifier.slice(2).split('/')[0]!;
  if (!specifier.startsWith('.')) return null;
  return path.relative(root, path.resolve(root, path.dirname(file), specifier)).split(path.sep)[0]!;
}

function packageName(specifier: string): string | null {
  if (specifier.startsWith('.') || specifier.startsWith('@/') || specifier.startsWith('node:') || builtinModules.includes(specifier.split('/')[0]!)) return null;
  const parts = specifier.split('/');
  return specifier.startsWith('@') ? `${parts[0]}/${parts[1]}` : parts[0]!;
}

const layers: Record<string, string[]> = {
  db: ['server', 'app', 'features', 'test'],
  shared: ['server', 'db', 'app', 'features', 'test'],
};

describe('imports', () => {
  it('finds static, re-export, side-effect, dynamic and require imports', () => {
    const source = `import a from 'x';\nimport type { B } from "../server/y";\nexport { c } from './z';\nimport 'side';\nawait import('dyn/sub');\nrequire('@scope/pkg/deep');`;
    expect(importsOf(source)).toEqual(['x', '../server/y', './z', 'side', 'dyn/sub', '@scope/pkg/deep']);
  });

  for (const [layer, forbidden] of Object.entries(layers)) {
    it(`${layer}/ imports nothing from ${forbidden.join(', ')}`, () => {
      const crossings = sourceFiles(layer).flatMap((file) =>
        importsOf(readFileSync(path.join(root, file), 'utf8'))
          .filter((s) => forbidden.includes(targetFolder(file, s) ?? ''))
          .map((s) => `${file} imports ${s}`),
      );
      expect(crossings).toEqual([]);
    });
  }

  it('declares in package.json every package the code imports', () => {
    const declared = new Set([...Object.keys(pkg.dependencies), ...Object.keys(pkg.devDependencies)]);
    const undeclared = ['app', 'features', 'shared', 'server', 'db', 'test'].flatMap((dir) =>
      sourceFiles(dir).flatMap((file) =>
        importsOf(readFileSync(path.join(root, file), 'utf8'))
          .map(packageName)
          .filter((name): name is string => name !== null && !declared.has(name))
          .map((name) => `${file}: ${name}`),
      ),
    );
    expect(undeclared).toEqual([]);
  });
});
