/** A progress bar on a terminal (stderr), and nothing at all when output is piped or in tests. */
import cliProgress from 'cli-progress';
import { stderrStream, type CliIo } from './io.js';

export interface Progress {
  stage(name: string, total: number, done?: number): void;
  stop(): void;
}

export function startProgress(io: CliIo): Progress {
  if (!io.progressTty) return { stage: () => {}, stop: () => {} };
  const bar = new cliProgress.SingleBar(
    { format: '  {stage} [{bar}] {percentage}%', stream: stderrStream(), clearOnComplete: true, hideCursor: true },
    cliProgress.Presets.shades_classic,
  );
  let current = '';
  let started = false;
  return {
    stage(name, total, done = 0) {
      if (!started) {
        bar.start(total, done, { stage: name });
        started = true;
      } else if (name !== current) bar.setTotal(total);
      current = name;
      bar.update(done, { stage: name });
    },
    stop() {
      if (started) bar.stop();
    },
  };
}
