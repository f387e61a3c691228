import { guardOutputStreams, processIo } from './io.js';
import { runCli } from './program.js';

guardOutputStreams();
process.exitCode = await runCli(process.argv.slice(2), processIo);
