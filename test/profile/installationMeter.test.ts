/**
 * A bank's controller reading a metering point away from the bank's board (`profile.bank.measuredAt`,
 * or a correction target's `target.measuredAt`): the bank on the invented Osier Mill pottery, its
 * controller measuring at the mill intake's incomer, or at the origin (the supply's terminals before the
 * service cable). The run is replayed with the general solver: in each interval the installation with the
 * loads and the kvar the study had connected, read at the metering point by the correction study's own
 * reader (solveMeter), fed to a fresh controller — whose steps must be the ones the study connected next.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import {
  boardOfInstallation,
  createBankController,
  driverColumns,
  InputError,
  normaliseInstallation,
  parseInstallation,
  planDrivers,
  planInstallationColumns,
  readBoardText,
  studyInstallationProfile,
  type ProfileSpec,
} from '@trivar/core';
import { scaleLoads, starBank, withLoadOn } from '../support/installationLoads.js';
import { meteringPlace, solveMeter } from '../../packages/core/src/correction/meteringPoint.js';

const spec = parseInstallation(readBoardText(readFileSync('examples/osier-mill-studios.yaml', 'utf8')));
const { installation } = normaliseInstallation(spec);
const loadNames = [installation.main, ...installation.subBoards].flatMap((b) => b.loads.map((l) => `${b.name}/${l.name}`));
const COUNT = 36;
const STEP_MS = 15 * 60_000;
const utcMs = Float64Array.from({ length: COUNT }, (_, i) => Date.UTC(2026, 2, 10) + i * STEP_MS);
/** Deterministic invented scales: a slow swing with a ripple, per load. */
const scales = loadNames.map((_, l) => Float64Array.from({ length: COUNT }, (_, i) => Math.max(0, 0.55 + 0.45 * Math.sin((i + 3 * l) / 4) + 0.1 * Math.cos(7 * i + l))));
const STEPS = [{ kvar: 1.5 }, { kvar: 1.5 }, { kvar: 1.5 }, { kvar: 1.5 }];
const SETTINGS = { targetPf: 0.99, responseShare: 0.67, delaySeconds: 0, reconnectSeconds: 0 };

/** The installation at interval i with `kvar` of star-connected capacitors on the pottery (board 1). */
function pottery(i: number, kvar: number) {
  return boardOfInstallation(withLoadOn(scaleLoads(installation, (k) => scales[k]![i]!), 1, starBank(installation, kvar)), 1);
}

function study(bank: ProfileSpec['bank'], options: { measuredAt?: string; measuredAtPath?: string } = {}) {
  const plan = planInstallationColumns(installation, ['time', ...loadNames.map((n) => `${n} [x]`)]);
  return studyInstallationProfile(
    {
      installation,
      loads: plan.board.loads,
      loadBoards: plan.loadBoards,
      drivers: planDrivers(plan),
      columns: driverColumns(plan, scales, COUNT),
      utcMs,
      intervalMs: STEP_MS,
      profile: { bank, ...(spec.profile?.tariff ? { tariff: spec.profile.tariff } : {}) },
    },
    { bank: true, bankBoard: 'Pottery', ...options },
  );
}

describe('a bank whose controller measures away from its board', () => {
  const atPottery = study({ ...SETTINGS, steps: STEPS });

  it.each(['Mill intake', 'origin'])('measured at %s: every switching decision is the general solve read there', (point) => {
    const s = study({ ...SETTINGS, steps: STEPS, measuredAt: point });
    const connected = s.connectedKvar!;
    const place = meteringPlace(pottery(0, 0), point)!;
    const controller = createBankController(
      STEPS.map((x) => ({ ...x, channel: 'ABC' as const })),
      SETTINGS,
    );
    let meterKvarhBefore = 0;
    let meterKvarhAfter = 0;
    const connectedNow = () => STEPS.reduce((a, x, k) => a + (controller.on[k] ? x.kvar : 0), 0);
    const readAt = (i: number) => {
      const read = solveMeter(pottery(i, connectedNow()), place);
      return { w: read.phases.reduce((a, p) => a + p.kW, 0) * 1000, var: read.phases.reduce((a, p) => a + p.kvar, 0) * 1000 };
    };
    for (let i = 0; i < COUNT; i++) {
      // With no delay the controller settles at the start of the interval: every move made, each read again.
      let reading = readAt(i);
      while (controller.advance(utcMs[i]!, utcMs[i]! + STEP_MS, () => reading) !== null) reading = readAt(i);
      expect(connected[i], `interval ${i}: the steps a controller reading ${point} has in`).toBe(connectedNow());
      const q = reading.var;
      meterKvarhAfter += (Math.max(0, q) / 1000) * 0.25;
      const without = solveMeter(pottery(i, 0), place);
      meterKvarhBefore += Math.max(0, without.phases.reduce((a, p) => a + p.kvar, 0)) * 0.25;
    }
    // The controller did switch, and not as one reading the pottery's own incomer does.
    expect(new Set(connected).size).toBeGreaterThan(1);
    expect([...connected]).not.toEqual([...atPottery.connectedKvar!]);
    const bank = s.result.bank!;
    expect(bank.meter!.point).toBe(point);
    expect(bank.meter!.before.energy.kvarhLagging).toBeCloseTo(meterKvarhBefore, 6);
    expect(bank.meter!.after.energy.kvarhLagging).toBeCloseTo(meterKvarhAfter, 6);
    // At the mill intake the meter is that board's incomer: the same summary as the board's own.
    if (point === 'Mill intake') expect(bank.meter!.after).toEqual(s.result.boards[0]!.after);
    // The bank is still on the pottery: its board's figures with the bank are the pottery's.
    expect(bank.after).toEqual(s.result.boards[1]!.after);
  });

  it('the origin reads the service cable too: the intake\'s currents, more import by the cable\'s losses only', () => {
    const r = study({ ...SETTINGS, steps: STEPS, measuredAt: 'origin' }).result;
    const origin = r.bank!.meter!;
    // The hours below the target are worked there, and say so.
    expect(r.bank!.measuredAt).toBe('origin');
    expect(study({ ...SETTINGS, steps: STEPS }).result.bank!.measuredAt).toBeNull();
    const intake = r.boards[0]!;
    // One current through the service cable: the origin's lines and neutral peak as the intake's do.
    origin.before.conductors.forEach((c, k) => expect(Math.abs(c.maxA - intake.before.conductors[k]!.maxA)).toBeLessThanOrEqual(1e-9 * c.maxA));
    expect(origin.before.energy.kWhImport).toBeGreaterThan(intake.before.energy.kWhImport);
    // 30 m of 95 mm² aluminium at tens of amperes: losses well under 1 % of the energy.
    expect(origin.before.energy.kWhImport / intake.before.energy.kWhImport - 1).toBeLessThan(0.01);
    // The tariff is priced where the meter is: the origin's months carry the demand charge.
    expect(origin.before.months[0]!.demandCharge).toBeGreaterThan(0);
  });

  it('sizes steps from the profile at the metering point', () => {
    const sized = study({ targetPf: 0.99, measuredAt: 'Mill intake' }).result.bank!;
    const own = study({ targetPf: 0.99 }).result.bank!;
    // The intake carries the compressor's lagging kvar as well as the pottery's: the need read there is larger.
    expect(sized.totalKvar).toBeGreaterThan(own.totalKvar);
  });

  it('names the field of a point the bank is not fed through', () => {
    try {
      study({ ...SETTINGS, steps: STEPS, measuredAt: 'Print room' });
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(InputError);
      const issue = (e as InputError).issues[0]!;
      expect([issue.code, issue.path]).toEqual(['not_upstream', 'profile.bank.measuredAt']);
      expect(issue.expected).toContain('"Mill intake"');
    }
    expect(() => study({ ...SETTINGS, steps: STEPS }, { measuredAt: 'Kiln shed', measuredAtPath: 'correction.target.measuredAt' })).toThrow(/correction\.target\.measuredAt/);
  });
});
