/**
 * The last few trial states of a board probe, found again by their outputs (the same outputs to
 * the bit, −0 apart from 0). A probe asks for every trial it solves, hundreds per study, so the
 * look-up compares one number per kept state (a weighted sum of the outputs) before it compares
 * whole vectors; which states are kept, and which is found, is what a plain scan of the ring gives.
 */
export class RememberedStates<S extends { readonly kvar: readonly number[] }> {
  private readonly states: S[] = [];
  private readonly keys: Float64Array;
  private next = 0;
  constructor(private readonly capacity: number) {
    this.keys = new Float64Array(capacity);
  }

  /** The kept state with exactly these outputs, or undefined. */
  find(kvar: readonly number[]): S | undefined {
    const key = outputsKey(kvar);
    // A NaN key (NaN or opposite infinities among the outputs) filters nothing: every state is compared.
    const filtered = key === key;
    const { states, keys } = this;
    for (let k = 0; k < states.length; k++) if ((!filtered || keys[k] === key) && sameOutputs(states[k]!.kvar, kvar)) return states[k];
    return undefined;
  }

  /** Keeps `state`, in place of the oldest once `capacity` are kept. */
  add(state: S): void {
    this.states[this.next] = state;
    this.keys[this.next] = outputsKey(state.kvar);
    this.next = (this.next + 1) % this.capacity;
  }
}

/** Equal outputs give equal keys (−0 and 0 alike; the vectors then tell them apart). */
function outputsKey(kvar: readonly number[]): number {
  let key = 0;
  for (let i = 0; i < kvar.length; i++) key += kvar[i]! * (i + 1);
  return key;
}

/** The same outputs to the bit (−0 apart from 0). */
function sameOutputs(a: readonly number[], b: readonly number[]): boolean {
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (!Object.is(a[i], b[i])) return false;
  return true;
}
