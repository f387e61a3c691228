/**
 * Detuned (blocking-reactor) capacitor steps: a reactor in series with each
 * capacitor so that the branch is inductive above its tuning order and cannot
 * resonate with the supply at the harmonics present.
 *
 * With p = X_L/X_C at the fundamental:
 * - tuning order n_r = 1/√p  (7 % → 3.78) [METHODS §5, confirmed: 7 % ↔ 189 Hz at 50 Hz];
 * - capacitor fundamental voltage U_C = U/(1 − p) [METHODS §5, confirmed];
 * - effective output Q_eff = Q_r·(U/U_r)²/(1 − p) [METHODS §5, confirmed worked example];
 * - branch admittance at order h: Y_h = j·B_C·h/(1 − h²·p)  (B_C the capacitor's susceptance at f1),
 *   from Z_h = j·X_C·(h·p − 1/h) [METHODS §5].
 */

/** The detuning factors in common use, % (common practice: 5.67/7 % for 5th-dominant spectra, 14 % where the 3rd matters). */
export const DETUNING_FACTORS_PERCENT = [5.67, 7, 14] as const;

/** Tuning order 1/√p of a detuned step. */
export const tuningOrder = (p: number): number => 1 / Math.sqrt(p);

/** Fundamental voltage across the capacitor of a detuned step at network voltage u, V. */
export const capacitorVoltage = (u: number, p: number): number => u / (1 - p);

/** Effective fundamental output of a detuned step of rating qRated at uRated, on network voltage u, kvar. */
export const detunedOutputKvar = (qRatedKvar: number, uRated: number, u: number, p: number): number => (qRatedKvar * (u / uRated) ** 2) / (1 - p);

/**
 * Susceptance of a detuned branch at order h (any real h ≠ n_r), S, from its
 * effective fundamental susceptance bEffective = B_C/(1 − p).
 */
export const detunedSusceptance = (bEffective: number, p: number, h: number): number => (bEffective * (1 - p) * h) / (1 - h * h * p);
