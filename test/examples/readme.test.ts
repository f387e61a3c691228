/** The README shows real output: its demo block must equal what the built CLI prints now. */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { ROOT, runTrivar } from '../cli/runTrivar.js';

describe('README', () => {
  const readme = readFileSync(`${ROOT}README.md`, 'utf8');
  it('demo output block matches `trivar solve examples/corner-bakery.yaml`', () => {
    const block = readme.split('<!-- demo-output:start -->')[1]!.split('<!-- demo-output:end -->')[0]!;
    const shown = block.replace(/^\s*```text\n/, '').replace(/```\s*$/, '');
    expect(shown.trimEnd()).toBe(runTrivar(['solve', 'examples/corner-bakery.yaml']).stdout.trimEnd());
  });
  it('correction output block matches `trivar correct examples/riverside-cold-store.yaml`', () => {
    const block = readme.split('<!-- correct-output:start -->')[1]!.split('<!-- correct-output:end -->')[0]!;
    const shown = block.replace(/^\s*```text\n/, '').replace(/```\s*$/, '');
    expect(shown.trimEnd()).toBe(runTrivar(['correct', 'examples/riverside-cold-store.yaml']).stdout.trimEnd());
  });
  it('comparison output block matches `trivar correct examples/cedar-falls-print-shop.yaml`', () => {
    const block = readme.split('<!-- compare-output:start -->')[1]!.split('<!-- compare-output:end -->')[0]!;
    const shown = block.replace(/^\s*```text\n/, '').replace(/```\s*$/, '');
    expect(shown.trimEnd()).toBe(runTrivar(['correct', 'examples/cedar-falls-print-shop.yaml']).stdout.trimEnd());
  });
  it('installation output block matches `trivar solve examples/maple-court-riser.yaml`', () => {
    const block = readme.split('<!-- installation-output:start -->')[1]!.split('<!-- installation-output:end -->')[0]!;
    const shown = block.replace(/^\s*```text\n/, '').replace(/```\s*$/, '');
    expect(shown.trimEnd()).toBe(runTrivar(['solve', 'examples/maple-court-riser.yaml']).stdout.trimEnd());
  });
  it('regional conventions block matches `trivar solve examples/pine-hollow-cabin.yaml`', () => {
    const block = readme.split('<!-- regions-output:start -->')[1]!.split('<!-- regions-output:end -->')[0]!;
    const shown = block.replace(/^\s*```text\n/, '').replace(/```\s*$/, '');
    expect(shown.trimEnd()).toBe(runTrivar(['solve', 'examples/pine-hollow-cabin.yaml']).stdout.trimEnd());
  });
  it('installation correction block matches `trivar correct examples/tannery-lane-works.yaml --board "Press shop" --arrangement star-bank`', () => {
    const block = readme.split('<!-- installation-correct-output:start -->')[1]!.split('<!-- installation-correct-output:end -->')[0]!;
    const shown = block.replace(/^\s*```text\n/, '').replace(/```\s*$/, '');
    expect(shown.trimEnd()).toBe(runTrivar(['correct', 'examples/tannery-lane-works.yaml', '--board', 'Press shop', '--arrangement', 'star-bank']).stdout.trimEnd());
  });
  it('metered installation correction block matches `trivar correct examples/tannery-lane-works.yaml --board "Press shop" --measured-at origin --pf 0.97 --arrangement star-bank`', () => {
    const block = readme.split('<!-- installation-metered-output:start -->')[1]!.split('<!-- installation-metered-output:end -->')[0]!;
    const shown = block.replace(/^\s*```text\n/, '').replace(/```\s*$/, '');
    const args = ['correct', 'examples/tannery-lane-works.yaml', '--board', 'Press shop', '--measured-at', 'origin', '--pf', '0.97', '--arrangement', 'star-bank'];
    expect(shown.trimEnd()).toBe(runTrivar(args).stdout.trimEnd());
  });
  it('harmonics output block matches `trivar harmonics examples/mill-street-offices.yaml`', () => {
    const block = readme.split('<!-- harmonics-output:start -->')[1]!.split('<!-- harmonics-output:end -->')[0]!;
    const shown = block.replace(/^\s*```text\n/, '').replace(/```\s*$/, '');
    expect(shown.trimEnd()).toBe(runTrivar(['harmonics', 'examples/mill-street-offices.yaml']).stdout.trimEnd());
  });
  it('installation harmonics block matches `trivar harmonics examples/harrow-yard-studios.yaml`', () => {
    const block = readme.split('<!-- harmonics-installation-output:start -->')[1]!.split('<!-- harmonics-installation-output:end -->')[0]!;
    const shown = block.replace(/^\s*```text\n/, '').replace(/```\s*$/, '');
    expect(shown.trimEnd()).toBe(runTrivar(['harmonics', 'examples/harrow-yard-studios.yaml']).stdout.trimEnd());
  });
  it('joint scan excerpt: each of its paragraphs is in `trivar harmonics examples/ferrybank-joinery.yaml` as shown', () => {
    const block = readme.split('<!-- harmonics-joint-excerpt:start -->')[1]!.split('<!-- harmonics-joint-excerpt:end -->')[0]!;
    const shown = block.replace(/^\s*```text\n/, '').replace(/```\s*$/, '').trimEnd();
    const output = runTrivar(['harmonics', 'examples/ferrybank-joinery.yaml']).stdout;
    const paragraphs = shown.split('\n\n');
    expect(paragraphs.length).toBeGreaterThanOrEqual(3);
    for (const p of paragraphs) expect(output).toContain(p);
  });
  it('installation harmonic check excerpt: each of its paragraphs is in `trivar correct examples/ferrybank-joinery.yaml --board "Machine shop" --arrangement delta-bank`', () => {
    const block = readme.split('<!-- installation-correct-harmonics-excerpt:start -->')[1]!.split('<!-- installation-correct-harmonics-excerpt:end -->')[0]!;
    const shown = block.replace(/^\s*```text\n/, '').replace(/```\s*$/, '').trimEnd();
    const output = runTrivar(['correct', 'examples/ferrybank-joinery.yaml', '--board', 'Machine shop', '--arrangement', 'delta-bank']).stdout;
    const paragraphs = shown.split('\n\n');
    expect(paragraphs.length).toBeGreaterThanOrEqual(2);
    for (const p of paragraphs) expect(output).toContain(p);
  }, 120_000);
  it.each([
    ['installation-banks-solve-excerpt', ['solve', 'examples/ferrybank-joinery.yaml']],
    ['installation-banks-correct-excerpt', ['correct', 'examples/ferrybank-joinery.yaml', '--board', 'Machine shop', '--arrangement', 'delta-bank', '--measured-at', 'origin']],
  ])('banks in service excerpt %s: each of its paragraphs is in the output as shown', (marker, args) => {
    const block = readme.split(`<!-- ${marker}:start -->`)[1]!.split(`<!-- ${marker}:end -->`)[0]!;
    const shown = block.replace(/^\s*```text\n/, '').replace(/```\s*$/, '').trimEnd();
    const output = runTrivar(args).stdout;
    const paragraphs = shown.split('\n\n');
    expect(paragraphs.length).toBeGreaterThanOrEqual(2);
    for (const p of paragraphs) expect(output).toContain(p);
  }, 120_000);
  it('detuned correction output block matches `trivar correct examples/quayside-print-works.yaml`', () => {
    const block = readme.split('<!-- correct-detuned-output:start -->')[1]!.split('<!-- correct-detuned-output:end -->')[0]!;
    const shown = block.replace(/^\s*```text\n/, '').replace(/```\s*$/, '');
    expect(shown.trimEnd()).toBe(runTrivar(['correct', 'examples/quayside-print-works.yaml']).stdout.trimEnd());
  });
  it.each(['quickstart.ts', 'correction-quickstart.ts'])('shows examples/%s as it is', (file) => {
    const source = readFileSync(`${ROOT}examples/${file}`, 'utf8');
    expect(readme).toContain(source.slice(source.indexOf('import {')).trimEnd());
  });
  it('names the two set-up commands', () => {
    expect(readme).toContain('npm run demo');
    expect(readme).toContain('npm test');
  });
});
