// A worker thread of the simulation pool. It loads the TypeScript sources through tsx (as
// bin/varsmith.mjs does), so the same file works under `npm start`, the CLI and the tests.
import { register } from 'tsx/esm/api';

register();
const task = await import('./task.ts');

export default task.runSimulationTask;
