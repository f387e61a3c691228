import { exitWhenFlushed, guardOutputStreams, processIo } from './io.js';
import { runCli } from './program.js';

guardOutputStreams();
// No top-level await: the bundle is a CommonJS-style script (see loader/runBundle.ts).
void runCli(process.argv.slice(2), processIo).then(exitWhenFlushed);
