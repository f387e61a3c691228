/**
 * Interval-data headers read against an installation (the invented Osier Mill studios): loads by a
 * name only one board has or as `<board>/<load>`, metered phases at the main board and at a sub-board,
 * groups, and each wrong name refused with its column or group member.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { InputError, normaliseInstallation, parseInstallation, planInstallationColumns, readBoardText } from '@trivar/core';

const { installation } = normaliseInstallation(parseInstallation(readBoardText(readFileSync('examples/osier-mill-studios.yaml', 'utf8'))));

function issuesOf(run: () => unknown): { path: string; code: string; message: string }[] {
  try {
    run();
  } catch (error) {
    if (error instanceof InputError) return error.issues.map((i) => ({ path: i.path, code: i.code, message: i.message }));
    throw error;
  }
  throw new Error('no error');
}

describe('installation column plan', () => {
  it('finds loads on any board, and metered phases on the board named', () => {
    const plan = planInstallationColumns(installation, ['time', 'Cafe [kW]', 'Pottery/Large kiln [x]', 'phase L1 [kW]', 'Print room/phase C [kW]', 'Print room/Drying cabinet [x]'], {
      groups: {},
    });
    const byName = new Map(plan.targets.map((t) => [t.name, t.loads.map((l) => [plan.board.loads[l]!.name, plan.loadBoards[l]])]));
    expect(byName.get('Cafe')).toEqual([['Mill intake/Cafe', 0]]);
    expect(byName.get('Pottery/Large kiln')).toEqual([['Pottery/Large kiln', 1]]);
    expect(byName.get('phase L1')).toEqual([['Mill intake/metered phase A', 0]]);
    expect(byName.get('Print room/phase C')).toEqual([['Print room/metered phase C', 2]]);
    expect(byName.get('Print room/Drying cabinet')).toEqual([['Print room/Drying cabinet', 2]]);
    // Every other load of the file is undriven, by its board-qualified name, but the workshop lighting: it is on
    // the main board's L1, which "phase L1" meters whole, so it is in that total, not off.
    expect(plan.undriven).toEqual(['Mill intake/Compressor', 'Pottery/Small kiln', 'Pottery/Wheels and pug mill', 'Print room/Press']);
    // Both metered phases are in kW alone: each is taken at its own board's rated power factor on that phase, and says so.
    expect(plan.notes).toHaveLength(2);
    expect(plan.notes![0]).toMatch(/^"phase L1 \[kW\]" has no kvar or pf column: taken at PF 0\.\d{3} lagging, the rated power factor of the board file's loads on that phase \(Mill intake\/Workshop lighting/);
  });

  it('a metered phase total beside a column for a load on that phase of the same board is refused, naming both', () => {
    // The press (ABC-delta) draws from phase C of the print room, which "Print room/phase C" meters whole.
    const issues = issuesOf(() => planInstallationColumns(installation, ['time', 'Print room/phase C [kW]', 'Print room/Press [x]']));
    expect(issues).toEqual([expect.objectContaining({ path: 'header ("Print room/phase C" and "Print room/Press")', code: 'counted_twice' })]);
    expect(issues[0]!.message).toContain('"Print room/Press" (ABC-delta)');
    // The same phase at the main board is another board's total: no overlap with the print room's press.
    expect(planInstallationColumns(installation, ['time', 'phase C [kW]', 'Print room/Press [x]']).targets).toHaveLength(2);
  });

  it('groups take bare or qualified names; a wrong member is named by its place in the group', () => {
    const plan = planInstallationColumns(installation, ['time', 'kilns [x]'], { groups: { kilns: ['Large kiln', 'Pottery/Small kiln'] } });
    expect(plan.targets[0]!.loads.map((l) => plan.board.loads[l]!.name)).toEqual(['Pottery/Large kiln', 'Pottery/Small kiln']);
    const issues = issuesOf(() => planInstallationColumns(installation, ['time', 'kilns [x]'], { groups: { kilns: ['Large kiln', 'Kiln shed/Small kiln'] } }));
    expect(issues).toEqual([expect.objectContaining({ path: 'profile.groups.kilns[1]', code: 'unknown_target' })]);
  });

  it('refuses unknown and ambiguous names and a phase the supply lacks, each at its column', () => {
    const twice = {
      ...installation,
      subBoards: installation.subBoards.map((sb, i) => (i === 1 ? { ...sb, loads: [...sb.loads, { ...installation.main.loads[2]! }] } : sb)),
    };
    const issues = issuesOf(() => planInstallationColumns(twice, ['time', 'Cafe [kW]', 'Oven [kW]', 'Kiln shed/phase A [kW]', 'Print room/Cafe [kW]']));
    expect(issues.map((i) => [i.path, i.code])).toEqual([
      ['header, column 2 ("Cafe [kW]")', 'ambiguous_target'],
      ['header, column 3 ("Oven [kW]")', 'unknown_target'],
      ['header, column 4 ("Kiln shed/phase A [kW]")', 'unknown_target'],
    ]);
    expect(issues[0]!.message).toContain('load "Cafe" on board "Mill intake" (write "Mill intake/Cafe") and load "Cafe" on board "Print room" (write "Print room/Cafe")');
  });
});

describe('names that meet: a load "Sub A/b" on the main board and a load "b" on board "Sub A"', () => {
  const file = (more: string) =>
    normaliseInstallation(
      parseInstallation(
        readBoardText(`name: Meeting names
supply: { voltage: 230/400, frequencyHz: 50 }
boards:
  - name: Main
    loads:
      - { name: "Sub A/b", connection: A-N, kW: 3 }
  - name: Sub A
    fedFrom: Main
    feeder: { lengthM: 10, line: { mm2: 10 }, neutral: { mm2: 10 } }
    loads:
      - { name: b, connection: A-N, kW: 4 }
${more}`),
      ),
    ).installation;
  const meeting = file('');

  it('says "Sub A/b" names both, each on its board, and offers only names that reach one alone', () => {
    const issues = issuesOf(() => planInstallationColumns(meeting, ['time', 'Sub A/b [x]']));
    expect(issues).toEqual([
      {
        path: 'header, column 2 ("Sub A/b [x]")',
        code: 'ambiguous_target',
        message: expect.stringContaining('one load; "Sub A/b" names 2: load "Sub A/b" on board "Main" (write "Main/Sub A/b") and load "b" on board "Sub A" (write "b")'),
      },
    ]);
    // The names offered do reach one load each.
    const plan = planInstallationColumns(meeting, ['time', 'Main/Sub A/b [x]', 'b [x]']);
    expect(plan.targets.map((t) => [t.name, t.loads.map((l) => [plan.board.loads[l]!.name, plan.loadBoards[l]])])).toEqual([
      ['Main/Sub A/b', [['Main/Sub A/b', 0]]],
      ['b', [['Sub A/b', 1]]],
    ]);
  });

  it('where no other name reaches a load alone, "<board>//<load>" does, and is offered', () => {
    // A third board with its own "b": bare "b" and "Sub A/b" now each name two loads.
    const three = file(`  - name: Shed
    fedFrom: Main
    feeder: { lengthM: 10, line: { mm2: 10 }, neutral: { mm2: 10 } }
    loads:
      - { name: b, connection: B-N, kW: 1 }
`);
    const issues = issuesOf(() => planInstallationColumns(three, ['time', 'Sub A/b [x]']));
    expect(issues[0]!.message).toContain('load "Sub A/b" on board "Main" (write "Main/Sub A/b") and load "b" on board "Sub A" (write "Sub A//b")');
    const plan = planInstallationColumns(three, ['time', 'Sub A//b [x]', 'Main//Sub A/b [x]', 'Shed/b [x]']);
    expect(plan.targets.map((t) => t.loads.map((l) => plan.loadBoards[l]))).toEqual([[1], [0], [2]]);
  });
});
