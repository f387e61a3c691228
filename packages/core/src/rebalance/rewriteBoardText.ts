/**
 * The board file text with moved circuits on their new connections. YAML keeps
 * its comments, order and layout (the yaml library's document model edits the
 * one field in place); JSON input stays JSON. Pure: the CLI does the writing.
 */
import { isMap, isSeq, parseDocument } from 'yaml';
import type { CircuitMove } from './rebalanceResult.js';

/**
 * @param text the board file as read (YAML or JSON).
 * @param moves the work order of a rebalancing report.
 * @example
 * rewriteBoardText('loads:\n  - { name: Kettle, connection: A-N, kW: 2 }\n', [{ circuit: 1, name: 'Kettle', from: 'A-N', to: 'B-N' }])
 * //=> 'loads:\n  - { name: Kettle, connection: B-N, kW: 2 }\n'
 */
export function rewriteBoardText(text: string, moves: readonly CircuitMove[]): string {
  if (/^\s*\{/.test(text)) {
    const board = JSON.parse(text) as { loads: { name: string; connection: string }[] };
    for (const m of moves) {
      const load = board.loads[m.circuit - 1];
      if (!load || load.name !== m.name) throw new Error(`rewriteBoardText: circuit ${m.circuit} is not "${m.name}" in this text`);
      load.connection = m.to;
    }
    return `${JSON.stringify(board, null, 2)}\n`;
  }
  const doc = parseDocument(text);
  const loads = doc.get('loads');
  if (!isSeq(loads)) throw new Error('rewriteBoardText: the text has no loads list');
  for (const m of moves) {
    const load = loads.items[m.circuit - 1];
    if (!isMap(load) || load.get('name') !== m.name) throw new Error(`rewriteBoardText: circuit ${m.circuit} is not "${m.name}" in this text`);
    load.set('connection', m.to);
  }
  return doc.toString();
}
