/**
 * A controller CT given below the current it must carry saturates: the CT line says so with its figures, C/k is
 * also given on the CT trivar would choose there, and the verdict is qualified ("meets the target with a CT of at
 * least …"). CT sizing itself is unchanged. Riverside cold store (invented example), its largest line current
 * 208.4 A before correction: 1.25 × 208.4 = 260.5 A → next standard primary 300 A. C/k of a 20.66 kvar balanced
 * step = Q/(√3·U·k_CT) = 20660/(√3·400·60) = 0.497 A on 300/5 A, and 5/100 of the current, 1.491 A, on 100/5 A.
 */
import { describe, expect, it } from 'vitest';
import { runTrivar } from './runTrivar.js';
import { expectClose } from '../support/tolerance.js';

const BOARD = 'examples/riverside-cold-store.yaml';
interface Controller {
  ctPrimaryA: number;
  ctChosen: boolean;
  responseThresholdA: number;
  smallestStepKvar: number;
  ctBasis: { currentA: number };
  ctNeeded: { primaryA: number; responseThresholdA: number; responseSettingA: number } | null;
}
interface CorrectJson {
  selection?: { controller: Controller };
  recommended?: string;
  outcomes?: { arrangement: string; report: { selection: { controller: Controller } } }[];
}

/** The controller of the build `trivar correct` reports (the one arrangement, or the recommended one). */
function recommendedController(args: string[]): Controller {
  const r = JSON.parse(runTrivar(['correct', BOARD, ...args, '--json']).stdout) as CorrectJson;
  if (r.selection) return r.selection.controller;
  return r.outcomes!.find((o) => o.arrangement === r.recommended)!.report.selection.controller;
}

describe('a CT given that is too small', () => {
  it('the JSON: the CT it needs and C/k on it, by hand', () => {
    const c = recommendedController(['--ct', '100', '--arrangement', 'delta-bank']);
    expect(c.ctChosen).toBe(false);
    expect(c.ctBasis.currentA).toBeGreaterThan(100);
    expect(c.ctNeeded!.primaryA).toBe(300);
    expectClose(c.ctNeeded!.responseThresholdA, (c.smallestStepKvar * 1000) / (Math.sqrt(3) * 400 * 60), { rel: 1e-9, abs: 0 }, 'C/k on 300/5');
    expectClose(c.ctNeeded!.responseThresholdA, 0.497, { rel: 2e-3, abs: 0 }, 'C/k on 300/5, hand figure');
    expectClose(c.responseThresholdA, 3 * c.ctNeeded!.responseThresholdA, { rel: 1e-12, abs: 0 }, 'C/k ∝ 1/k_CT');
    expectClose(c.ctNeeded!.responseSettingA, 0.65 * c.ctNeeded!.responseThresholdA, { rel: 1e-12, abs: 0 }, 'setting');
  });

  it('the text: headline qualified, the CT line marked with its figures, C/k on both CTs', () => {
    const text = runTrivar(['correct', BOARD, '--ct', '100', '--arrangement', 'delta-bank']).stdout.replace(/\s+/g, ' ');
    expect(text).toMatch(/^.*MEETS THE TARGET WITH A CT OF AT LEAST 300\/5 A/);
    expect(text).toContain('met with a controller CT of at least 300/5 A: the 100/5 A given is below the 208.4 A it must carry and saturates (see the warnings)');
    expect(text).toContain('← TOO SMALL: that current is 2.1 × its primary, so it saturates (see the warnings); the CT it needs: 300/5 A');
    expect(text).toMatch(/= 1\.491 A; set 0\.969 A \(0\.65 × C\/k\) on the 100\/5 A given; on 300\/5 A: C\/k 0\.497 A, set 0\.323 A/);
  });

  it('a CT given that is large enough, or none given: no mark, no qualification', () => {
    for (const args of [['--ct', '300'], []]) {
      const c = recommendedController([...args, '--arrangement', 'delta-bank']);
      expect(c.ctNeeded).toBeNull();
      const text = runTrivar(['correct', BOARD, ...args, '--arrangement', 'delta-bank']).stdout;
      expect(text).not.toContain('TOO SMALL');
      expect(text).not.toContain('WITH A CT OF AT LEAST');
    }
  });
});
