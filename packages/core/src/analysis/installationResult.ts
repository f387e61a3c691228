/**
 * The result of solving an installation: every board's result (the same shape
 * as a single board's), every feeder, and the installation's totals. Plain JSON.
 */
import type { Phasor } from '../complex.js';
import type { BankInService, PhaseId } from '../board/boardModel.js';
import type { BoardResult } from './boardResult.js';

export interface FeederConductorReading {
  readonly phase: PhaseId;
  /** Current from the feeding board towards this board, A. */
  readonly current: Phasor;
  readonly loadingPercent: number | null;
  /** Drop along this conductor's phase: |V| at the sending end minus |V| at the board, % of nominal line-to-neutral voltage (phase voltages as boards report them). */
  readonly voltageDropPercent: number;
}

export interface FeederReading {
  /** The board this feeder supplies. */
  readonly board: string;
  /** The board it starts from; null for the service feeder from the supply. */
  readonly from: string | null;
  /** The cable in words when sized from the cable library, else null. */
  readonly description: string | null;
  readonly lines: readonly FeederConductorReading[];
  /** Current in the feeder's neutral, from the board back towards the supply, A; null without a neutral. */
  readonly neutral: { readonly current: Phasor; readonly loadingPercent: number | null; readonly open: boolean } | null;
  /** Conductor losses (lines and neutral; the service feeder also the source windings), kW. */
  readonly lossesKW: number;
  /** The per-phase drop largest in size, sign kept (negative: a rise, as under export), %. For the service feeder, from the source EMF. */
  readonly voltageDropPercent: number;
}

export interface InstallationBoardResult {
  readonly name: string;
  /** The feeding board, or null for the main board. */
  readonly fedFrom: string | null;
  /** Boards between this one and the supply, counting itself (main board: 1). */
  readonly depth: number;
  readonly result: BoardResult;
}

/**
 * A capacitor bank of the file (`harmonics.banks`) in service at the fundamental, as solved: the
 * model's bank (its rating, steps and `stepsInService`, step numbers from 1) named by its board.
 */
export interface BankInServiceReading extends Omit<BankInService, 'boardIndex' | 'loads'> {
  /** The board it is on. */
  readonly board: string;
  /** Rated output of the parts in service (fixed part and steps in service) at rated voltage, kvar. */
  readonly ratedKvarInService: number;
  /** What those parts deliver at the solved voltages, kvar (capacitive +). */
  readonly deliveredKvar: number;
}

export interface InstallationResult {
  readonly installation: { readonly name: string; readonly system: string; readonly boardCount: number };
  /** Boards in feeding order (each after the board that feeds it), main board first. */
  readonly boards: readonly InstallationBoardResult[];
  /** One per board, in the same order. */
  readonly feeders: readonly FeederReading[];
  /** The file's capacitor banks in service at the fundamental (their parts are among their boards' loads, origin `added`); empty when none. */
  readonly banksInService: readonly BankInServiceReading[];
  readonly totals: {
    /** Delivered by the source EMFs. */
    readonly sourceKW: number;
    readonly sourceKvar: number;
    /** All loads on all boards. */
    readonly loadKW: number;
    readonly loadKvar: number;
    /** Source windings and every feeder. */
    readonly lossesKW: number;
    /**
     * The lowest voltage the limits judge anywhere (each board's `voltageCheck.lowest`: line-to-neutral,
     * line-to-line, at the loads), % of nominal, the board it is on and which voltage it is ("line-to-line A-B").
     */
    readonly lowestVoltagePercent: number;
    readonly lowestVoltageBoard: string;
    readonly lowestVoltageAt: string;
  };
}
