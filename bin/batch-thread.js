// A worker of a batch's pool (src/cli/batch.ts runTasks), started from the one-script build: it loads
// dist/bundle/main.cjs with its code cache, as the main thread did (cached-script.js), so it compiles none of
// its code again (src/thread-entry.ts), and builds the briefs it is handed (runBatchTask in src/cli/main.ts).
import { loadBundle } from './cached-script.js';

const { exports } = loadBundle();

export default function work(task) {
  return exports.runBatchTask(task);
}
