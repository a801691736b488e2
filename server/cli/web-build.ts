// Builds the Expo web app into dist/ when its sources changed since the last build.
import { createHash } from 'node:crypto';
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, readdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { brotliCompressSync, constants as zlib, gzipSync } from 'node:zlib';
import path from 'node:path';

const EXPO_ENV = { EXPO_NO_TELEMETRY: '1', EXPO_OFFLINE: '1', CI: '1' };

const SOURCES = ['app', 'features', 'shared', 'assets', 'content/codes', 'app.json', 'package-lock.json', 'tsconfig.json'];

function hashTree(root: string): string {
  const hash = createHash('sha256');
  const walk = (p: string) => {
    if (!existsSync(p)) return;
    const stat = statSync(p);
    if (stat.isDirectory()) for (const name of readdirSync(p).sort()) walk(path.join(p, name));
    else hash.update(path.relative(root, p)).update(readFileSync(p));
  };
  for (const s of SOURCES) walk(path.join(root, s));
  return hash.digest('hex');
}

export function buildWebIfChanged(root: string, options: { force?: boolean } = {}): { built: boolean; seconds: number } {
  const dist = path.join(root, 'dist');
  const stamp = path.join(dist, '.source-hash');
  const current = hashTree(root);
  if (!options.force && existsSync(stamp) && readFileSync(stamp, 'utf8') === current) return { built: false, seconds: 0 };
  const started = Date.now();
  console.log('Building the web app (expo export)...');
  const result = spawnSync(path.join(root, 'node_modules', '.bin', 'expo'), ['export', '--platform', 'web', '--output-dir', 'dist', '--clear'], {
    cwd: root,
    stdio: ['ignore', 'inherit', 'inherit'],
    env: { ...process.env, ...EXPO_ENV, NODE_ENV: 'production' },
  });
  if (result.status !== 0) throw new Error(`expo export failed (exit ${result.status})`);
  precompress(dist);
  writeFileSync(stamp, current);
  return { built: true, seconds: (Date.now() - started) / 1000 };
}

const COMPRESSIBLE = /\.(js|css|html|json|svg|ttf|otf|map|txt)$/;

/**
 * Writes name.br and name.gz beside every compressible file of the build (tiny ones too, so every
 * script answers the same way), once, at full
 * strength, so the server never compresses the 2 MB bundle per request.
 */
export function precompress(dir: string): void {
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    const file = path.join(dir, entry.name);
    if (entry.isDirectory()) {
      precompress(file);
      continue;
    }
    if (!COMPRESSIBLE.test(entry.name)) continue;
    const data = readFileSync(file);
    writeFileSync(`${file}.br`, brotliCompressSync(data, { params: { [zlib.BROTLI_PARAM_QUALITY]: 11, [zlib.BROTLI_PARAM_SIZE_HINT]: data.length } }));
    writeFileSync(`${file}.gz`, gzipSync(data, { level: 9 }));
  }
}

/** npm run dev: Expo's dev server with hot reload; the API server proxies pages to it. */
export function startExpoDevServer(root: string) {
  const child = spawn(path.join(root, 'node_modules', '.bin', 'expo'), ['start', '--web', '--localhost', '--port', '8081'], {
    cwd: root,
    stdio: ['ignore', 'inherit', 'inherit'],
    env: { ...process.env, ...EXPO_ENV },
  });
  process.on('exit', () => child.kill());
  return child;
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const root = path.resolve(import.meta.dirname, '../..');
  const r = buildWebIfChanged(root, { force: process.argv.includes('--force') });
  console.log(r.built ? `Web app built in ${r.seconds.toFixed(1)} s` : 'Web app is up to date');
}
