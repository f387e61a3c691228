/**
 * The supply resonance in every state the controller can put the bank in: the fixed part with each
 * combination of the switched steps.
 *
 * Fewer steps in means less capacitance, so every order of the LC network rises (the pencil B_C·v = μ·Γ·v of
 * capacitorPathReactance.ts: taking capacitance out lowers B_C, and with it every μ; h = 1/√μ). An order the
 * full bank keeps clear of a harmonic can land on one with part of the bank in (a bank at 7.5 with every step
 * in sits near 9 with two of three steps in), so each reachable state is judged with the same band and the
 * same watched orders as the every-step-in estimate (resonanceNearOrders, one definition).
 *
 * Each state is a small eigenproblem on the path's reactances and that state's capacitances: the network is
 * not solved again. States whose capacitance is the same on every branch (equal steps) are one network and
 * are worked once; the states they stand for are kept, so a warning can name each combination.
 */
import type { Board, LoadBranch } from '../board/boardModel.js';
import { capacitorPathReactance } from '../network/capacitorPathReactance.js';
import { CORRECTION_DEFAULTS } from './correctionDefaults.js';
import type { StepStateOrders, StepStateResonance } from './correctionResult.js';
import { addCorrectionEquipment, kvarFromSusceptance, type EquipmentGroup } from './equipment.js';
import { equipmentWithStepsOut, type SwitchableStep } from './switchedStepStates.js';

/** The watched orders (CORRECTION_DEFAULTS.resonanceWatchedOrders, with why) that a resonance order lies near: the one band every resonance check uses. */
export const resonanceNearOrders = (order: number): number[] =>
  CORRECTION_DEFAULTS.resonanceWatchedOrders.filter((h) => Math.abs(order - h) <= CORRECTION_DEFAULTS.resonanceNearFraction * h);

/** Two resonance orders closer than this fraction are one for the words (half a percent, well inside any scan's resolution). */
const SAME_ORDER = 0.005;

/** `orders` (ascending) without those within SAME_ORDER of the one before. */
export const distinctOrders = (orders: readonly number[]): number[] => orders.filter((h, k) => k === 0 || h > orders[k - 1]! * (1 + SAME_ORDER));

/** The watched orders near any of `orders`, ascending. */
export const watchedOrdersNear = (orders: readonly number[]): number[] => [...new Set(orders.flatMap(resonanceNearOrders))].sort((a, b) => a - b);

export interface StepStateResonanceInputs {
  /** The board without the equipment. */
  readonly board: Board;
  /** The equipment with every step in (the build verified). */
  readonly equipment: readonly EquipmentGroup[];
  /** The bank's steps as built: the fixed part (output null) stays in, the others switch (only what switching them out reads). */
  readonly steps: readonly SwitchableStep[];
  /** Capacitive loads already on the board, taken as capacitance in every state (as the every-step-in estimate takes them). */
  readonly boardCapacitors: readonly LoadBranch[];
}

/**
 * The resonance orders of every state the controller can reach, the states alike in capacitance worked once.
 * The every-step-in state is first; then by capacitance, most first. Without a fixed part, every step out is
 * the board as it was and is not one of the bank's states. Null where there is no switched step (the one
 * state is the every-step-in estimate) or no estimate at all (an ideal source, a path without reactance).
 */
export function stepStateResonance(input: StepStateResonanceInputs): StepStateResonance | null {
  const switched = input.steps.filter((s) => s.output !== null);
  if (!switched.length) return null;
  const board = input.board;
  const omega = 2 * Math.PI * board.frequencyHz;
  const hasFixed = input.steps.some((s) => s.output === null) || input.equipment.some((g) => g.branches.some((b) => b.susceptanceS < 0));
  const outputs = switched.map((s) => s.output!);
  const n = switched.length;
  // Most steps in first, so the every-step-in state leads; among as many, the lowest outputs first, so a network
  // of equal steps is named by its first combination ("1+2", alike "1+3" and "2+3").
  const bits = (m: number) => switched.map((_, k) => (m & (1 << k)) !== 0);
  const lowFirst = (a: number, b: number) => {
    const [x, y] = [bits(a), bits(b)];
    const k = x.findIndex((v, i) => v !== y[i]);
    return k < 0 ? 0 : x[k] ? -1 : 1;
  };
  const count = (m: number) => bits(m).filter(Boolean).length;
  const masks = Array.from({ length: 1 << n }, (_, m) => m)
    .filter((m) => hasFixed || m !== 0)
    .sort((a, b) => count(b) - count(a) || lowFirst(a, b));
  const bySusceptance = new Map<string, { stepsIn: boolean[]; alike: number[][] }>();
  for (const mask of masks) {
    const stepsIn = switched.map((_, k) => (mask & (1 << k)) !== 0);
    const equipment = equipmentWithStepsOut(input.equipment, switched, stepsIn, omega);
    // Electrically one network where every branch has the same susceptance (to a part in 1e9, round-off of the subtraction).
    const key = equipment.flatMap((g) => g.branches.map((b) => b.susceptanceS.toPrecision(9))).join(',');
    const seen = bySusceptance.get(key);
    if (seen) seen.alike.push(outputs.filter((_, k) => stepsIn[k]));
    else bySusceptance.set(key, { stepsIn, alike: [] });
  }
  const states: StepStateOrders[] = [];
  for (const { stepsIn, alike } of bySusceptance.values()) {
    const equipment = equipmentWithStepsOut(input.equipment, switched, stepsIn, omega);
    const added = addCorrectionEquipment(board, equipment).loads.slice(board.loads.length).flatMap((l) => l.branches);
    const path = capacitorPathReactance(board, [...input.boardCapacitors, ...added]);
    if (path === null) return null;
    const orders = distinctOrders(path.resonanceOrders);
    const capacitorKvar = equipment.flatMap((g) => g.branches).reduce((s, b) => s + (b.susceptanceS > 0 ? kvarFromSusceptance(b.susceptanceS, b.vNominal) : 0), 0);
    states.push({
      outputsIn: outputs.filter((_, k) => stepsIn[k]),
      outputsOut: outputs.filter((_, k) => !stepsIn[k]),
      alike,
      capacitorKvarAtNominalV: capacitorKvar,
      orders,
      lowestOrder: orders[0] ?? null,
      nearOrders: watchedOrdersNear(orders),
      resonancesNear: orders.filter((h) => resonanceNearOrders(h).length > 0),
    });
  }
  const [allIn, ...rest] = states;
  rest.sort((a, b) => b.capacitorKvarAtNominalV - a.capacitorKvarAtNominalV);
  const ordered = [allIn!, ...rest];
  return {
    states: ordered,
    combinations: masks.length,
    fixedPart: {
      reactors: input.equipment.some((g) => g.branches.some((b) => b.susceptanceS < 0)),
      capacitors: input.steps.some((s) => s.output === null),
    },
    nearStates: ordered.filter((s) => s.nearOrders.length > 0).length,
  };
}
