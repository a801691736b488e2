// Serves the app over an already prepared database: no install, no build, no demo data.
// npm run start:prod runs its compiled form (build/server/cli/serve.js) with NODE_ENV=production;
// also used for extra instances behind a load balancer and by the durability test.
import { loadConfig, productionProblems } from '../config';
import { StartRefused, startServer } from '../index';

function refuse(lines: string[]): never {
  console.error(`Causeway will not start in production:\n${lines.map((l) => `  - ${l}`).join('\n')}`);
  process.exit(1);
}

const problems = productionProblems();
if (problems.length > 0) refuse(problems);
const running = await startServer(loadConfig()).catch((err: unknown) => (err instanceof StartRefused ? refuse([err.message]) : Promise.reject(err)));
console.log(`listening ${running.url}`);
const stop = () => void running.stop().then(() => process.exit(0));
process.on('SIGTERM', stop);
process.on('SIGINT', stop);
