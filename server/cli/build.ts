// npm run build: the server (and its search worker) compiled to JavaScript in build/, and the
// web app exported to dist/. npm run start:prod runs the result with plain node, no tsx.
import { cpSync, rmSync } from 'node:fs';
import path from 'node:path';
import { build } from 'vite';
import { buildWebIfChanged } from './web-build';

/** Programs run from build/: each compiled file keeps its source path, so import.meta.url lookups hold. */
const ENTRIES = ['server/cli/serve.ts', 'server/cli/db.ts', 'server/search/worker.ts'];

export async function buildServer(root: string, outDir = path.join(root, 'build')): Promise<number> {
  const started = Date.now();
  rmSync(outDir, { recursive: true, force: true });
  await build({
    root,
    configFile: false,
    logLevel: 'warn',
    build: {
      ssr: true, // Node target; packages stay imports from node_modules
      outDir,
      target: 'node20',
      minify: false,
      sourcemap: true,
      rollupOptions: {
        input: Object.fromEntries(ENTRIES.map((e) => [e.replace(/\.ts$/, ''), path.join(root, e)])),
        output: { format: 'esm', preserveModules: true, preserveModulesRoot: root, entryFileNames: '[name].js' },
      },
    },
  });
  // files read at run time beside the code that reads them
  cpSync(path.join(root, 'db', 'migrations'), path.join(outDir, 'db', 'migrations'), { recursive: true });
  cpSync(path.join(root, 'server', 'search', 'worker-boot.mjs'), path.join(outDir, 'server', 'search', 'worker-boot.mjs'));
  return (Date.now() - started) / 1000;
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const root = path.resolve(import.meta.dirname, '../..');
  const seconds = await buildServer(root);
  console.log(`Server compiled to build/ in ${seconds.toFixed(1)} s`);
  if (!process.argv.includes('--server-only')) {
    const web = buildWebIfChanged(root);
    console.log(web.built ? `Web app built in ${web.seconds.toFixed(1)} s` : 'Web app is up to date');
  }
}
