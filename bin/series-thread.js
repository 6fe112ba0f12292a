// The second series thread of a many-series brief (src/brief/share.ts), started from the one-script build:
// it loads dist/bundle/main.cjs with its code cache, as the main thread did (cached-script.js), so it
// compiles none of its code again (src/thread-entry.ts), and runs the thread (threadMain in src/cli/main.ts).
import { loadBundle } from './cached-script.js';

await loadBundle().exports.threadMain('series');
