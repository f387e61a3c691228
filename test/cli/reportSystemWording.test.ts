/**
 * `trivar report` words a board as its system is: a single-phase 2-wire board has one line, one source
 * voltage and no star point, and no line-to-line sentence; a split-phase board has two lines and one
 * line-to-line voltage. Checked on the Markdown and the HTML report of a board with a correction and
 * harmonic data, so the correction and harmonics sections are read too.
 */
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runTrivar } from './runTrivar.js';

/** A weighbridge hut at a gravel pit: one 230 V line and its neutral from a small pole transformer. */
const WEIGHBRIDGE_HUT = `name: Gravel pit weighbridge hut
supply:
  system: single-phase
  voltage: { lineToNeutral: 230 }
  frequencyHz: 50
  transformer: { kVA: 40, impedancePercent: 4, xOverR: 3 }
feeder:
  line: { lengthM: 35, rOhmPerKm: 1.15, xOhmPerKm: 0.09, ratingA: 50 }
  neutral: { lengthM: 35, rOhmPerKm: 1.15, xOhmPerKm: 0.09, ratingA: 50 }
loads:
  - { name: Wheel-wash pump, connection: A-N, kW: 3.2, pf: 0.7 }
  - { name: Cabin heater, connection: A-N, model: constant-impedance, kW: 2 }
  - { name: Scale terminal, connection: A-N, kW: 0.6, pf: 0.9, spectrum: switch-mode }
correction:
  target: { pf: 0.95 }
`;

/** An orchard packing barn on a 120/240 V service: two lines, their neutral, and a line-to-line cooler. */
const PACKING_BARN = `name: Orchard packing barn
supply:
  system: split-phase
  voltage: { lineToNeutral: 120 }
  frequencyHz: 60
  transformer: { kVA: 37.5, impedancePercent: 2.5, xOverR: 2 }
feeder:
  line: { lengthM: 45, rOhmPerKm: 0.5, xOhmPerKm: 0.1, ratingA: 150 }
  neutral: { lengthM: 45, rOhmPerKm: 0.5, xOhmPerKm: 0.1, ratingA: 150 }
loads:
  - { name: Grading belt, connection: A-N, kW: 2.2, pf: 0.75 }
  - { name: Lights and sockets, connection: B-N, kW: 1.1, pf: 0.95, spectrum: switch-mode }
  - { name: Cold room compressor, connection: A-B, kW: 5.5, pf: 0.8 }
correction:
  target: { pf: 0.95 }
`;

function reports(name: string, yaml: string): { md: string; html: string } {
  const dir = mkdtempSync(join(tmpdir(), 'trivar-system-words-'));
  const file = join(dir, `${name}.yaml`);
  writeFileSync(file, yaml);
  for (const ext of ['md', 'html']) expect(runTrivar(['report', file, '-o', join(dir, `${name}.${ext}`)]).code).toBe(0);
  return { md: readFileSync(join(dir, `${name}.md`), 'utf8'), html: readFileSync(join(dir, `${name}.html`), 'utf8') };
}

/** The HTML with its tags dropped, so a sentence reads as on the page. */
const htmlText = (html: string) => html.replace(/<style[\s\S]*?<\/style>/g, '').replace(/<svg[\s\S]*?<\/svg>/g, '').replace(/<[^>]+>/g, ' ').replace(/&#39;|&apos;/g, "'");

describe('trivar report: wording that follows the board\'s system', () => {
  it('single-phase 2-wire: no line-to-line sentence, no star point, one line, one source voltage, one EMF', () => {
    const { md, html } = reports('weighbridge-hut', WEIGHBRIDGE_HUT);
    for (const text of [md, htmlText(html)]) {
      expect(text).not.toMatch(/Line-to-line:\s*\./);
      expect(text).not.toContain('Line-to-line:');
      expect(text).not.toMatch(/star point|wye point/);
      expect(text).not.toContain('each line');
      expect(text).not.toContain('Each line');
      expect(text).not.toContain('balanced');
      expect(text).not.toContain('three (or two) EMFs');
      expect(text).not.toContain('Steinmetz');
      expect(text).not.toContain('supply EMFs');
    }
    expect(md).toContain('- **Feeder, line:** 35 m at 1.15 + j0.09 Ω/km, rated 50 A');
    expect(md).toContain('- **Source voltages:** at nominal voltage');
    expect(md).toContain("_Voltage of the line to the neutral bar; the N row gives the neutral bar voltage to the source's neutral terminal and the neutral current._");
    expect(md).toContain('- The source is one EMF behind the source impedance;');
    expect(md).toContain('**The line before and after**');
    expect(md).toContain('| No. | Circuit | Connection |');
  });

  it('split-phase: the one line-to-line voltage, the center tap, two EMFs, lines rather than phases', () => {
    const { md, html } = reports('packing-barn', PACKING_BARN);
    for (const text of [md, htmlText(html)]) {
      expect(text).toMatch(/Line-to-line: A-B \d+\.\d V\./);
      expect(text).not.toMatch(/star point|wye point/);
      expect(text).not.toContain('three (or two) EMFs');
      expect(text).not.toContain('Steinmetz');
    }
    expect(md).toContain("_Each line's voltage to the neutral bar; the N row gives the neutral bar voltage to the transformer center tap and the neutral current.");
    expect(md).toContain('- The source is two EMFs behind the source impedance;');
    expect(md).toContain('- **Feeder, each line:** 45 m at 0.5 + j0.1 Ω/km, rated 150 A');
    expect(md).toContain('| No. | Circuit | Connection |');
  });

  it('three-phase keeps its own words: phases, the star point, three EMFs', () => {
    const dir = mkdtempSync(join(tmpdir(), 'trivar-system-words-'));
    expect(runTrivar(['report', 'examples/riverside-cold-store.yaml', '-o', join(dir, 'r.md')]).code).toBe(0);
    const md = readFileSync(join(dir, 'r.md'), 'utf8');
    expect(md).toContain('_Phase voltages to the neutral bar; the N row gives the neutral bar voltage to the source star point and the neutral current. Line-to-line: ');
    expect(md).toContain('- The source is three EMFs behind the source impedance;');
    expect(md).toContain('| No. | Circuit | Phase |');
  });
});
