/**
 * The board or installation file text with moved circuits on their new
 * connections. YAML keeps its comments, order and layout (the yaml library's
 * document model edits the one field in place); JSON input stays JSON. Pure:
 * the CLI does the writing.
 */
import { isMap, isSeq, parseDocument, type YAMLMap } from 'yaml';
import type { CircuitMove } from './rebalanceResult.js';
import { readPhaseTerm, spellIn } from '../board/conventions/phaseNames.js';
import { assertText } from '../board/modelGuards.js';

/** The new connection in the naming the file wrote the old one in (L1-N for a file in L1/L2/L3). */
const asWritten = (old: unknown, to: string) => spellIn((typeof old === 'string' && readPhaseTerm(old)?.naming) || 'A/B/C', to);

type Move = Pick<CircuitMove, 'listPosition' | 'name' | 'to'> & { readonly board?: string };

const mismatch = (m: Move) => new Error(`rewriteBoardText: load ${m.listPosition} is not "${m.name}"${m.board ? ` on board "${m.board}"` : ''} in this text`);

interface JsonBoard {
  name?: string;
  loads: { name: string; connection: string }[];
}

/** The loads list a move refers to: the file's own (a board file) or its board's (an installation file). */
function jsonLoads(file: JsonBoard & { boards?: JsonBoard[] }, m: Move) {
  if (!file.boards) return file.loads;
  const board = file.boards.find((b) => b.name === m.board);
  if (!board) throw mismatch(m);
  return board.loads;
}

function yamlLoads(doc: ReturnType<typeof parseDocument>, m: Move) {
  const boards = doc.get('boards');
  if (!isSeq(boards)) return doc.get('loads');
  const board = boards.items.find((b): b is YAMLMap => isMap(b) && b.get('name') === m.board);
  if (!board) throw mismatch(m);
  return board.get('loads');
}

/**
 * @param text the board or installation file as read (YAML or JSON).
 * @param moves the work order of a rebalancing report.
 * @example
 * rewriteBoardText('loads:\n  - { name: Kettle, connection: A-N, kW: 2 }\n', [{ listPosition: 1, name: 'Kettle', to: 'B-N' }])
 * //=> 'loads:\n  - { name: Kettle, connection: B-N, kW: 2 }\n'
 */
export function rewriteBoardText(text: string, moves: readonly Move[]): string {
  assertText(text);
  if (/^\s*\{/.test(text)) {
    const file = JSON.parse(text) as JsonBoard & { boards?: JsonBoard[] };
    for (const m of moves) {
      const load = jsonLoads(file, m)[m.listPosition - 1];
      if (!load || load.name !== m.name) throw mismatch(m);
      load.connection = asWritten(load.connection, m.to);
    }
    return `${JSON.stringify(file, null, 2)}\n`;
  }
  const doc = parseDocument(text);
  for (const m of moves) {
    const loads = yamlLoads(doc, m);
    if (!isSeq(loads)) throw new Error('rewriteBoardText: the text has no loads list');
    const load = loads.items[m.listPosition - 1];
    if (!isMap(load) || load.get('name') !== m.name) throw mismatch(m);
    load.set('connection', asWritten(load.get('connection'), m.to));
  }
  return doc.toString();
}

/** The same for an installation file (boards: [...]); one function serves both. */
export const rewriteInstallationText = rewriteBoardText;
