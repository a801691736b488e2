// Serves the app over an already prepared database: no install, no build, no demo data.
// Used for extra instances behind a load balancer and by the durability test.
import { loadConfig } from '../config';
import { startServer } from '../index';

const running = await startServer(loadConfig());
console.log(`listening ${running.url}`);
const stop = () => void running.stop().then(() => process.exit(0));
process.on('SIGTERM', stop);
process.on('SIGINT', stop);
