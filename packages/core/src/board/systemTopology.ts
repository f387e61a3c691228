/** Which phases and conductors each supply system has. */
import type { SystemKind } from './boardSchema.js';

export type PhaseId = 'A' | 'B' | 'C';

export function phasesOf(system: SystemKind): readonly PhaseId[] {
  switch (system) {
    case 'three-phase-4wire':
    case 'three-phase-3wire':
      return ['A', 'B', 'C'];
    case 'split-phase':
      return ['A', 'B'];
    case 'single-phase':
      return ['A'];
  }
}

export const systemHasNeutral = (system: SystemKind): boolean => system !== 'three-phase-3wire';
export const isThreePhase = (system: SystemKind): boolean => system === 'three-phase-4wire' || system === 'three-phase-3wire';
