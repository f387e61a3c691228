/**
 * Names written in study sections — profile scenarios and groups, the tariff's currency, rebalance
 * conditions and pins, correction units and metering points, harmonics banks' boards — are held to
 * the rule of a load's name (visible text, no control characters or direction overrides), refused at
 * their field path. Before, they were plain strings: "night\u202Eshift" reached the scenario table and
 * an ESC sequence the currency printed beside every charge.
 */
import { describe, expect, it } from 'vitest';
import { NAME_MAX_CHARACTERS, validateBoard, validateInstallation } from '@trivar/core';
import { runTrivar } from '../cli/runTrivar.js';

const supply = { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 } as const;
// An invented pottery: a kiln and a wheel.
const loads = [
  { name: 'kiln', connection: 'A-N', kW: 6, pf: 0.9 },
  { name: 'wheel', connection: 'B-N', kW: 1, pf: 0.7 },
];
const NO_CONTROLS = 'text without control characters (NUL, tab, line breaks, escape) or direction overrides (U+202A–U+202E, U+2066–U+2069)';
const failures = (v: ReturnType<typeof validateBoard> | ReturnType<typeof validateInstallation>) => (v.ok ? [] : v.issues.map((i) => `${i.path}: ${i.expected}`));

describe('names in the study sections of a board file', () => {
  it.each([
    ['profile.scenarios[0].name', { profile: { scenarios: [{ name: 'night\u202eshift', hours: 10, loads: {} }] } }],
    ['profile.tariff.currency', { profile: { tariff: { currency: '\u001b[1m$' } } }],
    ['profile.groups.throwing.0', { profile: { groups: { throwing: ['wheel\u0000'] } } }],
    ['rebalance.conditions[0].name', { rebalance: { conditions: [{ name: 'peak\u0085hour' }] } }],
    ['rebalance.pinned[0]', { rebalance: { pinned: ['kiln\u2066'] } }],
    ['rebalance.pinned[0].circuit', { rebalance: { pinned: [{ circuit: 'kiln\n' }] } }],
    ['correction.catalogue[0].name', { correction: { catalogue: [{ name: 'C\u202e5', ratedKvar: 5, ratedV: 400, ratedHz: 50 }] } }],
    ['correction.target.measuredAt', { correction: { target: { measuredAt: 'origin\t' } } }],
  ])('%s: refused with the name rule', (path, sections) => {
    const issues = failures(validateBoard({ supply, loads, ...sections }));
    expect(issues).toEqual([`${path.replace(/\.(\d+)$/, '[$1]')}: ${NO_CONTROLS}`]);
  });

  it('a group or scenario load named by a key is refused as a key, naming it (zod said "Invalid key in record")', () => {
    const v = validateBoard({ supply, loads, profile: { groups: { ['shop\u001bfloor']: ['kiln'] }, scenarios: [{ name: 'day', hours: 5, loads: { ['k\u202eiln']: 1 } }] } });
    expect(v.ok).toBe(false);
    expect(v.ok ? [] : v.issues.map((i) => [i.code, i.path, i.expected, i.received])).toEqual([
      ['invalid_key', 'profile.groups.shop\u001bfloor', `a key that is ${NO_CONTROLS}`, '"shop\\u001bfloor"'],
      // The received text escapes the direction override too (JSON.stringify left it raw); the path stays exact.
      ['invalid_key', 'profile.scenarios[0].loads.k\u202eiln', `a key that is ${NO_CONTROLS}`, '"k\\u202eiln"'],
    ]);
    expect(failures(validateBoard({ supply, loads, correction: { lightLoad: { fraction: 0.2, perLoad: { ['kiln\u0007']: 0 } } } }))).toEqual([`correction.lightLoad.perLoad.kiln\u0007: a key that is ${NO_CONTROLS}`]);
  });

  it('holds a new name to 100 characters and a reference to a board and load joined by "//" to 202', () => {
    expect(failures(validateBoard({ supply, loads, profile: { scenarios: [{ name: 'x'.repeat(NAME_MAX_CHARACTERS + 1), hours: 1, loads: {} }] } }))).toEqual([
      'profile.scenarios[0].name: a text of at most 100 characters',
    ]);
    expect(failures(validateBoard({ supply, loads, profile: { tariff: { currency: 'pottery-dollars' } } }))).toEqual(['profile.tariff.currency: a text of at most 8 characters']);
    const reference = `${'b'.repeat(100)}//${'l'.repeat(100)}`;
    expect(failures(validateBoard({ supply, loads, rebalance: { conditions: [{ name: 'peak', circuits: { [reference]: 1 } }] } }))).toEqual([]);
  });

  it('keeps readable names of any script, and spaces inside them', () => {
    const v = validateBoard({
      supply,
      loads,
      profile: { groups: { 'ろくろ 場': ['wheel'] }, scenarios: [{ name: 'Soirée ☕', hours: 10, loads: { 'ろくろ 場': 1 } }], tariff: { currency: '€' } },
      rebalance: { conditions: [{ name: 'שיא ערב' }], pinned: [{ circuit: 'kiln' }] },
    });
    expect(v.ok).toBe(true);
  });
});

describe('names in the study sections of an installation file', () => {
  const boards = [
    { name: 'yard', loads },
    { name: 'glaze room', fedFrom: 'yard', feeder: { lengthM: 20, line: { mm2: 10 }, neutral: { mm2: 10 } }, loads: [{ name: 'spray booth', connection: 'C-N', kW: 2 }] },
  ];
  it('refuses control characters in board names the sections refer to, at their paths', () => {
    const v = validateInstallation({
      supply,
      boards,
      correction: { board: 'glaze\u0000room' },
      rebalance: { boards: ['yard\u202e'], measureAt: 'main\u001b' },
      harmonics: { banks: [{ board: 'yard\u0085', connection: 'delta', ratedV: 400, stepsKvar: [5] }] },
      profile: { bank: { measuredAt: 'origin\u2028' } },
    });
    expect(failures(v).sort()).toEqual(
      ['correction.board', 'harmonics.banks[0].board', 'profile.bank.measuredAt', 'rebalance.boards[0]', 'rebalance.measureAt'].map((p) => `${p}: ${NO_CONTROLS}`),
    );
  });
});

describe('the terminal never receives the raw characters', () => {
  it('trivar profile refuses a scenario name with an escape sequence; its error is escaped, nothing printed to stdout', () => {
    const file = JSON.stringify({ supply, loads, profile: { scenarios: [{ name: 'day\u001b[2Jrun', hours: 8000, loads: { kiln: 1 } }] } });
    const r = runTrivar(['profile', '-'], file);
    expect(r.code).toBe(3);
    expect(r.stdout).toBe('');
    expect(r.stderr).not.toMatch(/[\u0000-\u0008\u000b-\u001f\u007f-\u009f\u202a-\u202e]/);
    expect(r.stderr).toContain('profile.scenarios[0].name: expected text without control characters');
  });
});
