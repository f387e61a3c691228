/** The open-neutral section of `trivar solve` as a user reads it, on the house example. */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { readBoardText, solveBoard } from '@trivar/core';
import { ROOT, runTrivar } from './runTrivar.js';

describe('trivar solve: broken-neutral study', () => {
  const r = runTrivar(['solve', 'examples/maple-lane-house.yaml']);
  const section = r.stdout.split('If the neutral conductor broke')[1]!.split('\nWarnings')[0]!;

  it('shows the state reached, the all-impedance answer and the other solution side by side', () => {
    expect(r.code).toBe(0);
    expect(section).toMatch(/circuit\s+phase\s+V\s+%nom\s+V if Z\s+%nom\s+V alt\s+%nom/);
    expect(section).toMatch(/Kitchen\s+A\s+2\d\d\.\d\s+1\d\d\.\d\s+OVER/);
  });

  it('says the answer is not unique and where the low-voltage rule decides it', () => {
    expect(section).toContain('The open-neutral equations have 2 solutions');
    expect(section).toContain('rests on a modelling choice');
    expect(section).toContain('depends on the load model');
    expect(section).toMatch(/hazardous/);
  });

  it('fits 100 columns', () => {
    for (const line of section.split('\n')) expect(line.length, line).toBeLessThanOrEqual(100);
  });

  it('the README quotes the figures the study gives', () => {
    const study = solveBoard(readBoardText(readFileSync(`${ROOT}examples/maple-lane-house.yaml`, 'utf8'))).openNeutral!;
    const pair = (s: { loads: readonly { name: string; voltage: number }[] }) =>
      `${Math.round(s.loads.find((l) => l.name === 'Kitchen')!.voltage)} V / ${Math.round(s.loads.find((l) => l.name === 'Bedrooms')!.voltage)} V`;
    const readme = readFileSync(`${ROOT}README.md`, 'utf8').replace(/\s+/g, ' ');
    expect(readme).toContain(`the report shows ${pair(study)}`);
    expect(readme).toContain(`the other solution, ${pair(study.otherStates[0]!)}`);
  });
});
