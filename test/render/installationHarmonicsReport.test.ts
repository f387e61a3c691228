/**
 * The harmonic study in an installation's report: an overview with a row per
 * board and the supply intake's IEEE 519 check, then a section per board (the
 * feeder into it, its busbar voltages against their levels (IEC 61000-2-2 here), its neutral, and the
 * scan and duty of a bank on it). Every figure is the study's, rounded as shown.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import {
  buildInstallationReport,
  correctInstallation,
  normaliseInstallation,
  parseInstallation,
  readBoardText,
  renderReportHtml,
  renderReportMarkdown,
  solveInstallation,
  studyInstallationHarmonics,
  type ReportBlock,
  type ReportDocument,
  type ReportSection,
} from '@trivar/core';

const HARROW = readBoardText(readFileSync(new URL('../../examples/harrow-yard-studios.yaml', import.meta.url), 'utf8')) as Record<string, unknown>;

function reportOf(raw: unknown) {
  const spec = parseInstallation(raw);
  const result = solveInstallation(spec);
  const harmonics = studyInstallationHarmonics(raw);
  return { spec, result, harmonics, doc: buildInstallationReport({ spec, result, harmonics }) };
}

const section = (doc: ReportDocument, id: string): ReportSection => {
  const s = doc.sections.find((x) => x.id === id);
  if (!s) throw new Error(`no section ${id}`);
  return s;
};
type Table = Extract<ReportBlock, { kind: 'table' }>;
const table = (s: ReportSection, caption: RegExp): Table => {
  const t = s.blocks.find((b): b is Table => b.kind === 'table' && caption.test(b.caption));
  if (!t) throw new Error(`no table "${caption}" in ${s.id}`);
  return t;
};
const facts = (s: ReportSection) => new Map(s.blocks.flatMap((b) => (b.kind === 'facts' ? b.items : [])));
const lists = (s: ReportSection, tone?: string) => s.blocks.flatMap((b) => (b.kind === 'list' && b.tone === tone ? b.items : []));
const r1 = (x: number) => x.toFixed(1);

describe('installation report with the harmonic study', () => {
  const { doc, harmonics } = reportOf(HARROW);
  const boardIds = ['board-main-switchboard', 'board-workshop', 'board-studios-ground', 'board-studios-upper'];

  it('adds the overview and one section per board after the boards, before the closing sections', () => {
    const ids = doc.sections.map((s) => s.id);
    expect(ids.slice(-(boardIds.length + 4))).toEqual(['harmonics', ...boardIds.map((b) => `${b}-harmonics`), 'assumptions', 'standards', 'cautions']);
    expect(doc.sections.filter((s) => s.id.endsWith('-harmonics')).map((s) => s.title)).toEqual(harmonics.boards.map((b) => `Harmonics — ${b.board}`));
    // Without the study the report is as before.
    const plain = buildInstallationReport({ spec: parseInstallation(HARROW), result: solveInstallation(parseInstallation(HARROW)) });
    expect(plain.sections.some((s) => s.id.includes('harmonics'))).toBe(false);
  });

  it('overview: a row per board with the study’s busbar THD, feeder current, neutral and triplen figures', () => {
    const t = table(section(doc, 'harmonics'), /Every board/);
    expect(t.rows.map((r) => r[0])).toEqual(harmonics.boards.map((b) => b.board));
    harmonics.boards.forEach((b, k) => {
      const row = t.rows[k]!;
      const worst = Math.max(...b.voltageDistortion.buses.map((x) => x.thdPercent ?? 0));
      expect(Number(row[1]!.split(' ')[0])).toBe(Number(r1(worst)));
      expect(row[2]).toBe(b.voltageDistortion.ok ? 'within' : 'exceeds');
      const largest = Math.max(...b.lines.map((l) => l.current.rms));
      expect(Number(row[3]!.split(' ')[0])).toBe(Number(r1(largest)));
      expect(Number(row[5])).toBe(Number(r1(b.neutral!.current.rms)));
      expect(Number(row[6])).toBe(Number(r1(b.triplenNeutralA!)));
    });
    // Studios ground: 178.3 A in a neutral rated 110 A (the figures `trivar harmonics` prints for this example).
    expect(t.rows[2]!.slice(5)).toEqual(['178.3', '177.5', '162 OVER', '0.655']);
    // An IEC installation: every busbar is judged against the IEC 61000-2-2 levels, and each is over 3 % at h13
    // (4.0–5.4 %) and 0.4 % at h15; against IEEE 519's flat 5 % only the workshop's h13 5.3 % would be over.
    expect(t.rows.map((r) => r[2])).toEqual(['exceeds', 'exceeds', 'exceeds', 'exceeds']);
    expect(t.note).toMatch(/against the IEC 61000-2-2 compatibility levels/);
  });

  it('overview: IEEE 519 at the supply intake, spectra by board, and every warning naming its board', () => {
    const s = section(doc, 'harmonics');
    const tdd = table(s, /at the supply intake \(IEEE 519\)/);
    expect(tdd.rows.map((r) => [r[0], r[1], r[3]])).toEqual(harmonics.tdd!.lines.map((l) => [l.phase, r1(l.tddPercent), l.ok ? 'within limits' : 'exceeds']));
    const warnings = lists(s, 'warning');
    expect(warnings).toHaveLength(harmonics.warnings.length);
    for (const w of harmonics.warnings) expect(warnings).toContain(`${w.board ?? 'supply intake'}: ${w.message}`);
    expect(warnings.some((w) => /^Studios ground: the neutral carries 178\.3 A/.test(w))).toBe(true);
    expect(lists(s).some((x) => x.startsWith('Extract fan drive (Workshop): six-pulse-drive-choke'))).toBe(true);
  });

  it('each board: the currents in the feeder into it, its busbar voltages against the IEC 61000-2-2 levels per bus, its neutral', () => {
    harmonics.boards.forEach((b, k) => {
      const s = section(doc, `${boardIds[k]}-harmonics`);
      const currents = table(s, /^Currents in the (service )?feeder/);
      expect(currents.rows.map((r) => r[0])).toEqual(['A', 'B', 'C', 'N']);
      expect(currents.rows.slice(0, 3).map((r) => [r[1], r[3]])).toEqual(b.lines.map((l) => [r1(l.current.rms), r1(l.current.thdPercent!)]));
      expect(currents.rows[3]![1]).toBe(r1(b.neutral!.current.rms));
      const buses = table(s, /Bus voltage distortion/);
      expect(buses.rows.map((r) => r[0])).toEqual(['A-N', 'B-N', 'C-N', 'A-B', 'B-C', 'C-A']);
      expect(buses.rows.map((r) => r[4])).toEqual(b.voltageDistortion.buses.map((x) => (x.ok ? 'within limits' : 'exceeds')));
      expect(facts(s).get('Neutral loading')).toEqual(b.neutral!.loadingPercent === null ? 'no rating entered' : expect.stringMatching(/^\d+ % of \d+ A/));
    });
    const workshop = table(section(doc, 'board-workshop-harmonics'), /Bus voltage/);
    expect(workshop.caption).toBe('Bus voltage distortion at Workshop (IEC 61000-2-2 compatibility levels: a level per order, 8 % THD)');
    expect(workshop.rows[0]!.slice(1)).toEqual(['6.9', 'h13 5.3 %', 'h9 1.7 % (level 1.5 %), h13 5.3 % (level 3 %), h15 0.8 % (level 0.4 %)', 'exceeds']);
    expect(facts(section(doc, 'board-studios-ground-harmonics')).get('Neutral loading')).toBe('162 % of 110 A — OVERLOADED');
  });

  it('the bank’s board carries its scan (every state) and its duty; no other board has one', () => {
    const s = section(doc, 'board-workshop-harmonics');
    const bank = harmonics.scans.find((x) => x.board === 'Workshop')!;
    const scan = table(s, /Resonance with the supply seen from Workshop/);
    // Three steps: 2³ states, each with the study's capacitive output and peaks.
    expect(scan.rows).toHaveLength(8);
    expect(scan.rows.map((r) => [r[0], r[1]])).toEqual(bank.scan.combinations.map((c) => [c.label, r1(c.capacitorKvar)]));
    expect(scan.rows.at(-1)!.slice(3)).toEqual(['12.6, 12.7', '13']);
    expect(s.blocks.some((b) => b.kind === 'figure' && b.name === 'board-workshop-impedance-scan')).toBe(true);
    expect(facts(s).get('Duty verdict')).toBe(bank.capacitorDuty!.ok ? 'within limits in every state' : 'LIMIT EXCEEDED in at least one state');
    expect(facts(s).get('Highest capacitor voltage (fundamental, any state checked, every load off included)')).toBe('402.8 V');
    for (const id of ['board-main-switchboard', 'board-studios-ground', 'board-studios-upper'])
      expect(section(doc, `${id}-harmonics`).blocks.some((b) => b.kind === 'figure' || (b.kind === 'table' && /Resonance/.test(b.caption)))).toBe(false);
  });

  it('closing sections: the study’s cautions and standards; Markdown writes the scan beside the report', () => {
    expect(lists(section(doc, 'cautions'), 'caution')).toEqual(expect.arrayContaining([...harmonics.cautions]));
    const standards = table(section(doc, 'standards'), /Where each figure/).rows.map((r) => r[0]);
    expect(standards).toContain('IEEE Std 519-2014');
    expect(standards).toContain('IEC 60831-1 / IEEE Std 18');
    const md = renderReportMarkdown(doc, 'harrow');
    expect(md.files.map((f) => f.name)).toContain('harrow-board-workshop-impedance-scan.svg');
    expect(md.markdown).toMatch(/^## Harmonics — Studios upper$/m);
    expect(renderReportHtml(doc)).toContain('<section id="board-workshop-harmonics">');
  });

  it('without a bank the scan is seen from the main board, as the study makes it', () => {
    const { harmonics: h, doc: d } = reportOf({ ...HARROW, harmonics: { background: [{ order: 5, percent: 1.5 }] } });
    expect(h.scans.map((x) => x.board)).toEqual(['Main switchboard']);
    const s = section(d, 'board-main-switchboard-harmonics');
    expect(table(s, /Resonance with the supply seen from Main switchboard/).rows.map((r) => r[0])).toEqual(h.scans[0]!.scan.combinations.map((c) => c.label));
    expect(h.scans[0]!.scan.combinations).toHaveLength(1);
    expect(facts(s).has('Duty verdict')).toBe(false);
  });

  it('with a correction study the overview takes the resonance estimate’s place and the boards’ sections follow it', () => {
    const spec = parseInstallation(HARROW);
    const result = solveInstallation(spec);
    const c = correctInstallation(normaliseInstallation(spec).installation, { arrangement: 'delta-bank' }, { board: 'Workshop' });
    const correction = { board: c.board, report: c.report, effect: c.effect };
    const estimate = buildInstallationReport({ spec, result, correction }).sections.map((s) => s.id);
    // The correction study's own estimate sits between its recommendation and its effect on the installation.
    expect(estimate.slice(estimate.indexOf('correction'), estimate.indexOf('correction') + 3)).toEqual(['correction', 'harmonics', 'correction-effect']);
    const ids = buildInstallationReport({ spec, result, correction, harmonics }).sections.map((s) => s.id);
    expect(ids.filter((i) => i === 'harmonics')).toHaveLength(1);
    const at = ids.indexOf('harmonics');
    expect(ids.slice(at - 1, at + 6)).toEqual(['correction', 'harmonics', ...boardIds.map((b) => `${b}-harmonics`), 'correction-effect']);
  });
});

describe('installation report with two banks: the scan with the other banks switched', () => {
  const FERRYBANK = readBoardText(readFileSync(new URL('../../examples/ferrybank-joinery.yaml', import.meta.url), 'utf8')) as Record<string, unknown>;
  const { doc, harmonics } = reportOf(FERRYBANK);

  it('each bank’s board shows the scan with every other bank on, then a row per state over the other banks’ states', () => {
    for (const s of harmonics.scans) {
      const id = `board-${s.board.toLowerCase().replace(/ /g, '-')}-harmonics`;
      table(section(doc, id), new RegExp(`^Resonance with the supply seen from ${s.board}, every other bank fully on`));
      const joint = table(section(doc, id), new RegExp(`^Resonance seen from ${s.board} with the other banks switched`));
      const j = s.jointScan!;
      expect(joint.rows).toHaveLength(j.combinations.length);
      joint.rows.forEach((row, k) => {
        const c = j.combinations[k]!;
        expect(row[0]).toBe(c.label);
        expect(row[2]).toBe(`${r1(c.lowestPeak!.order)} … ${r1(c.highestPeak!.order)}`);
        expect(row[3]).toContain(`h ${c.nearest!.order.toFixed(2)}`);
        expect(row[4]).toBe(c.nearest!.otherBanks);
        expect(row[5]).toBe(c.nearOrders.map((n) => n.order).join(', ') || '—');
      });
      expect(joint.note).toMatch(/other banks scanned at .*every state of their steps, whatever order they switch in, combined; \d+ networks/);
    }
    // The machine shop's full bank is clear of the 7th with the finishing shop's on, on it with that bank off.
    const machine = harmonics.scans.find((s) => s.board === 'Machine shop')!;
    const full = machine.jointScan!.combinations.find((c) => c.label === 'steps 1+2+3')!;
    expect(machine.scan.combinations.find((c) => c.label === 'steps 1+2+3')!.nearOrders).not.toContain(7);
    expect(full.nearOrders.find((n) => n.order === 7)!.peak.otherBanks).toBe('Finishing shop bank off');
    expect(lists(section(doc, 'harmonics'), 'warning')).toContainEqual(expect.stringMatching(/^Machine shop: Machine shop bank steps 1\+2\+3 with Finishing shop bank off: resonance with the supply at h ≈ 7\.0\d, within ±10 % of order 7/));
  });

  it('the duty says it was checked with the other banks on, out of service and at the switched states near a checked order', () => {
    const f = facts(section(doc, 'board-machine-shop-harmonics'));
    expect(f.get('Worst state')).toMatch(/other banks on, out of service and in any state the joint scan finds near a checked order\)$/);
  });
});
