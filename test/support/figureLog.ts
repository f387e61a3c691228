/**
 * Worst-case figures measured by a test file (largest residual, worst
 * disagreement...), kept in memory and written to a JSON file after the file's
 * tests. Tests may not print, and a report needs the numbers, so they go to a
 * file; each test file writes its own so parallel workers never share one.
 */
import { writeFileSync } from 'node:fs';
import fc from 'fast-check';

interface Figure {
  worst: number;
  /** What produced the worst value, for replaying it. */
  at: string | null;
  samples: number;
}

export class FigureLog {
  private readonly figures = new Map<string, Figure>();
  private readonly notes: Record<string, unknown> = {};

  constructor(private readonly file: URL) {}

  /** Keeps the largest `value` seen under `key`. */
  note(key: string, value: number, at: string | null = null): void {
    const f = this.figures.get(key) ?? { worst: 0, at: null, samples: 0 };
    f.samples++;
    if (!(value <= f.worst)) {
      f.worst = value;
      f.at = at;
    }
    this.figures.set(key, f);
  }

  worst(key: string): number {
    return this.figures.get(key)?.worst ?? 0;
  }

  /** Free-form context written beside the figures (tool version, network count...). */
  describe(key: string, value: unknown): void {
    this.notes[key] = value;
  }

  write(): void {
    const figures = Object.fromEntries(this.figures);
    const body = { writtenAt: new Date().toISOString(), seed: fc.readConfigureGlobal().seed ?? null, ...this.notes, figures };
    writeFileSync(this.file, `${JSON.stringify(body, null, 2)}\n`);
  }
}
