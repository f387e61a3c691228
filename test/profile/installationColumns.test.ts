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
    const plan = planInstallationColumns(installation, ['time', 'Cafe [kW]', 'Pottery/Large kiln [x]', 'phase L1 [kW]', 'Print room/phase C [kW]', 'Print room/Press [x]'], {
      groups: {},
    });
    const byName = new Map(plan.targets.map((t) => [t.name, t.loads.map((l) => [plan.board.loads[l]!.name, plan.loadBoards[l]])]));
    expect(byName.get('Cafe')).toEqual([['Mill intake/Cafe', 0]]);
    expect(byName.get('Pottery/Large kiln')).toEqual([['Pottery/Large kiln', 1]]);
    expect(byName.get('phase L1')).toEqual([['Mill intake/metered phase A', 0]]);
    expect(byName.get('Print room/phase C')).toEqual([['Print room/metered phase C', 2]]);
    expect(byName.get('Print room/Press')).toEqual([['Print room/Press', 2]]);
    // Every other load of the file is undriven, by its board-qualified name.
    expect(plan.undriven).toEqual(['Mill intake/Workshop lighting', 'Mill intake/Compressor', 'Pottery/Small kiln', 'Pottery/Wheels and pug mill', 'Print room/Drying cabinet']);
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
    expect(issues[0]!.message).toContain('"Mill intake/Cafe", "Print room/Cafe"');
  });
});
