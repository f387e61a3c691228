/**
 * A CT given far below the current it must carry is marked in the report as `trivar correct` marks it: on
 * the CT's own line, with the CT it needs and C/k on both. Riverside cold store (an invented example) with
 * controller.ctPrimaryA 100 on a board whose largest line current is 208.4 A before correction.
 */
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { ROOT, runTrivar } from './runTrivar.js';

describe('report: a CT given too small', () => {
  it('says so on the CT line, with the CT it needs and C/k on each, figures as correct --json gives them', () => {
    const dir = mkdtempSync(join(tmpdir(), 'trivar-ct-report-'));
    const file = join(dir, 'riverside-ct-100.yaml');
    writeFileSync(file, readFileSync(`${ROOT}examples/riverside-cold-store.yaml`, 'utf8').replace('controller: { outputs: 6 }', 'controller: { outputs: 6, ctPrimaryA: 100 }'));
    const json = JSON.parse(runTrivar(['correct', file, '--json']).stdout);
    const c = json.selection.controller;
    expect(c.ctPrimaryA).toBe(100);
    expect(c.ctNeeded.primaryA).toBe(300);
    // C/k = Q_step / (√3·U) / (CT ratio): 20.66 kvar at 400 V on 300/5 A is 0.497 A (METHODS.md §10).
    expect(c.ctNeeded.responseThresholdA).toBeCloseTo(20660 / (Math.sqrt(3) * 400) / 60, 2);
    const html = runTrivar(['report', file]);
    expect(html.code).toBe(0);
    const flat = html.stdout.replace(/<[^>]+>/g, ' ').replace(/\s+/g, ' ');
    const times = (c.ctBasis.currentA / 100).toFixed(1);
    expect(flat).toContain(`Too small: that current is ${times} × its primary, so it saturates and the controller misreads; the CT it needs: 300/5 A`);
    expect(flat).toContain(`on the CT given; on 300/5 A: C/k ${c.ctNeeded.responseThresholdA.toFixed(3)} A, set ${c.ctNeeded.responseSettingA.toFixed(3)} A`);
  }, 60_000);
});
