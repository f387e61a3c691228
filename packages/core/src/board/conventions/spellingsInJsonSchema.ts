/**
 * The exported JSON Schema says what a file may contain as written, before
 * readTradeSpellings turns it into trivar's spelling: L1/L2/L3 beside every A/B/C
 * term and key the step translates, and `supply.system` optional (notation gives it).
 * The zod schema stays in the one spelling the rules and solver read.
 */
import { NUMBERED_SPELLING, REVERSED_PAIRS } from './phaseNames.js';

type Json = Record<string, unknown> & { enum?: unknown[] };
const isObj = (x: unknown): x is Json => typeof x === 'object' && x !== null && !Array.isArray(x);

/** Adds the L1/L2/L3 spelling of every phase term in enums and property keys, everywhere under `node`. */
function addNumbered(node: unknown): void {
  if (Array.isArray(node)) return node.forEach(addNumbered);
  if (!isObj(node)) return;
  if (Array.isArray(node.enum) && node.enum.some((v) => typeof v === 'string' && v in NUMBERED_SPELLING))
    node.enum = [
      ...node.enum,
      ...node.enum.flatMap((v) => (typeof v === 'string' && NUMBERED_SPELLING[v] ? [NUMBERED_SPELLING[v]] : [])),
      // Line pairs the other way round (B-A, L1-L3) name the same pair; the reader takes them.
      ...Object.keys(REVERSED_PAIRS).filter((pair) => node.enum!.includes(REVERSED_PAIRS[pair]!)),
    ];
  if (isObj(node.properties)) {
    const props = node.properties;
    for (const key of Object.keys(props)) {
      const numbered = NUMBERED_SPELLING[key];
      if (numbered && !(numbered in props)) props[numbered] = props[key];
    }
  }
  for (const value of Object.values(node)) addNumbered(value);
}

/** Where readTradeSpellings translates phase terms, as property paths from the file's root. */
const SPELT = [['supply'], ['feeder'], ['loads'], ['boards'], ['rebalance', 'pinned'], ['rebalance', 'lineCapacityA'], ['correction', 'target', 'perPhase']];

function at(schema: Json, path: readonly string[]): Json | null {
  let node: unknown = schema;
  for (const key of path) {
    // Through optional wrappers (anyOf with a single object) to the properties.
    const withProps = isObj(node) && isObj(node.properties) ? node : null;
    node = withProps ? (withProps.properties as Json)[key] : undefined;
  }
  return isObj(node) ? node : null;
}

/** The file schema as written; modifies and returns `schema`. */
export function withTradeSpellings(schema: Json): Json {
  for (const path of SPELT) {
    const node = at(schema, path);
    if (node) addNumbered(node);
  }
  const supply = at(schema, ['supply']);
  if (supply && Array.isArray(supply.required)) supply.required = supply.required.filter((k) => k !== 'system');
  // `written` is how a validated spec remembers its notation; a file writes the notation itself.
  const voltage = at(schema, ['supply', 'voltage']);
  for (const form of Array.isArray(voltage?.anyOf) ? voltage.anyOf : [])
    if (isObj(form) && isObj(form.properties)) delete form.properties.written;
  return schema;
}
