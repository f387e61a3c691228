/**
 * The board or installation file text with moved circuits on their new
 * connections: each moved load's connection value is replaced where it stands in
 * the text, so every other byte (comments, flow or block style, quoting, line
 * breaks) stays as written and a diff shows the moves only. A value the text
 * cannot be edited at (an alias) goes through the yaml library's document model;
 * JSON input stays JSON. Pure: the CLI does the writing.
 */
import { isAlias, isMap, isScalar, isSeq, parseDocument, visit, type Scalar, type YAMLMap } from 'yaml';
import type { CircuitMove } from './rebalanceResult.js';
import { readPhaseTerm, spellIn } from '../board/conventions/phaseNames.js';
import { assertText } from '../board/modelGuards.js';
import { CONNECTIONS } from '../board/boardRanges.js';
import { InputError, inputIssue, quoteText } from '../errors.js';

/** The new connection in the naming the file wrote the old one in (L1-N for a file in L1/L2/L3). */
const asWritten = (old: unknown, to: string) => spellIn((typeof old === 'string' && readPhaseTerm(old)?.naming) || 'A/B/C', to);

type Move = Pick<CircuitMove, 'listPosition' | 'name' | 'to'> & { readonly board?: string };

const HEADING = 'rewriteBoardText: the moves do not fit this text';

/** A move that names a load the text does not have at that place: the report is of another file. */
const mismatch = (m: Move, k: number, found: unknown) =>
  new InputError(
    [inputIssue('not_in_text', `moves[${k}]`, `load ${m.listPosition}${m.board ? ` of board ${quoteText(m.board)}` : ''} to be ${quoteText(m.name)}, as in the file the report was made from`, found)],
    HEADING,
  );

/**
 * The moves as a report gives them, checked before the text is touched: a move to a connection no board
 * takes (`Z-N`) would be written into the file as it stands.
 * @returns each move's connection in A/B/C naming (a move may spell it L1-N)
 */
function checkedMoves(moves: unknown): string[] {
  if (!Array.isArray(moves)) throw new InputError([inputIssue('invalid_type', 'moves', 'the list of moves of a rebalancing report (report.moves)', moves)], HEADING);
  const issues = moves.flatMap((m: unknown, k) => {
    if (typeof m !== 'object' || m === null) return [inputIssue('invalid_type', `moves[${k}]`, 'a move { listPosition, name, to }', m)];
    const { listPosition, name, to } = m as Record<string, unknown>;
    const found = [];
    if (!Number.isInteger(listPosition) || (listPosition as number) < 1) found.push(inputIssue('invalid_value', `moves[${k}].listPosition`, "the load's place in its loads list, a whole number from 1", listPosition));
    if (typeof name !== 'string') found.push(inputIssue('invalid_type', `moves[${k}].name`, "the load's name, as text", name));
    const canonical = typeof to === 'string' ? (readPhaseTerm(to)?.canonical ?? to) : undefined;
    if (!(CONNECTIONS as readonly unknown[]).includes(canonical))
      found.push(inputIssue('invalid_value', `moves[${k}].to`, `a connection: one of ${CONNECTIONS.map((c) => `"${c}"`).join(', ')} (or its L1/L2/L3 spelling)`, to));
    return found;
  });
  if (issues.length) throw new InputError(issues, HEADING);
  return moves.map((m: Move) => readPhaseTerm(m.to)?.canonical ?? m.to);
}

interface JsonBoard {
  name?: string;
  loads: { name: string; connection: string }[];
}

/** The loads list a move refers to: the file's own (a board file) or its board's (an installation file). */
function jsonLoads(file: JsonBoard & { boards?: JsonBoard[] }, m: Move, k: number): unknown {
  if (!Array.isArray(file.boards)) return file.loads;
  const board = file.boards.find((b) => b?.name === m.board);
  if (!board) throw mismatch(m, k, undefined);
  return board.loads;
}

function yamlLoads(doc: ReturnType<typeof parseDocument>, m: Move, k: number) {
  const boards = doc.get('boards');
  if (!isSeq(boards)) return doc.get('loads');
  const board = boards.items.find((b): b is YAMLMap => isMap(b) && b.get('name') === m.board);
  if (!board) throw mismatch(m, k, undefined);
  return board.get('loads');
}

const noLoads = () => new InputError([inputIssue('missing', 'text', 'a board or installation file with a loads list')], HEADING);

/** One connection value to replace in the text: its span and what goes there. */
interface TextEdit {
  readonly start: number;
  readonly end: number;
  readonly text: string;
}

/**
 * The edit that puts `written` where a connection value stands, quoted as the file quotes it; null where the
 * value is not a plain or quoted scalar of the text (an alias, a block scalar): the document model writes it then.
 */
function scalarEdit(node: unknown, written: string): TextEdit | null {
  // An anchored value is also every alias of it: edited where it stands, the loads written `*anchor` would move too.
  if (!isScalar(node) || !node.range || node.anchor) return null;
  const quote = node.type === 'QUOTE_DOUBLE' ? '"' : node.type === 'QUOTE_SINGLE' ? "'" : node.type === 'PLAIN' ? '' : null;
  if (quote === null) return null;
  return { start: node.range[0], end: node.range[1], text: `${quote}${written}${quote}` };
}

/** The loads each move names, checked against it, with the connection value's node. */
function movedLoads(doc: ReturnType<typeof parseDocument>, moves: readonly Move[]) {
  return moves.map((m, k) => {
    const loads = yamlLoads(doc, m, k);
    if (!isSeq(loads)) throw noLoads();
    const load = loads.items[m.listPosition - 1];
    if (!isMap(load) || load.get('name') !== m.name) throw mismatch(m, k, isMap(load) ? load.get('name') : undefined);
    return load;
  });
}

/**
 * The text with each moved load's connection value replaced where it stands: every other byte (comments,
 * flow or block style, quoting, line breaks) as the file has it. Null where one of them cannot be edited so.
 */
function editedInPlace(text: string, doc: ReturnType<typeof parseDocument>, moves: readonly Move[], targets: readonly string[]): string | null {
  const edits: TextEdit[] = [];
  for (const [k, load] of movedLoads(doc, moves).entries()) {
    const node = load.get('connection', true);
    const edit = scalarEdit(node, asWritten(isScalar(node) ? node.value : undefined, targets[k]!));
    if (!edit) return null;
    edits.push(edit);
  }
  // From the end of the text back, so each span's offsets hold while the ones after it change.
  return edits.sort((a, b) => b.start - a.start).reduce((out, e) => `${out.slice(0, e.start)}${e.text}${out.slice(e.end)}`, text);
}

/** Every alias of `node`'s anchor replaced by a copy of its value, so the anchored value can change alone. */
function keepForAliases(doc: ReturnType<typeof parseDocument>, node: Scalar): void {
  const anchor = node.anchor;
  visit(doc, {
    Alias(_, alias) {
      if (alias.source !== anchor) return undefined;
      const copy = node.clone() as Scalar;
      delete (copy as { anchor?: string }).anchor;
      return copy;
    },
  });
}

/**
 * @param text the board or installation file as read (YAML or JSON).
 * @param moves the work order of a rebalancing report.
 * @returns the text with only the moved loads' connection values changed; everything else byte for byte.
 * @example
 * rewriteBoardText('loads:\n  - { name: Kettle, connection: A-N, kW: 2 }\n', [{ listPosition: 1, name: 'Kettle', to: 'B-N' }])
 * //=> 'loads:\n  - { name: Kettle, connection: B-N, kW: 2 }\n'
 */
export function rewriteBoardText(text: string, moves: readonly Move[]): string {
  assertText(text);
  const targets = checkedMoves(moves);
  if (/^\s*\{/.test(text)) {
    let file: JsonBoard & { boards?: JsonBoard[] };
    try {
      file = JSON.parse(text) as typeof file;
    } catch (error) {
      throw new InputError([inputIssue('invalid_json', 'text', 'the JSON text of a board or installation file', (error as Error).message)], HEADING);
    }
    moves.forEach((m, k) => {
      const loads = jsonLoads(file, m, k);
      if (!Array.isArray(loads)) throw noLoads();
      const load = loads[m.listPosition - 1] as { name?: unknown; connection?: unknown } | undefined;
      if (typeof load !== 'object' || load === null || load.name !== m.name) throw mismatch(m, k, typeof load === 'object' && load !== null ? load.name : undefined);
      load.connection = asWritten(load.connection, targets[k]!);
    });
    // JSON is YAML too: its double-quoted strings are edited where they stand, the rest of the text kept.
    const doc = parseDocument(text);
    const kept = doc.errors.length === 0 ? editedInPlace(text, doc, moves, targets) : null;
    return kept ?? `${JSON.stringify(file, null, 2)}\n`;
  }
  const doc = parseDocument(text);
  const kept = editedInPlace(text, doc, moves, targets);
  if (kept !== null) return kept;
  movedLoads(doc, moves).forEach((load, k) => {
    const node = load.get('connection', true);
    // The value as the file means it (an alias read through to its anchor), for the naming the file writes.
    const value = isAlias(node) ? node.resolve(doc) : node;
    // A moved value other loads refer to by alias: they keep it, written out in full, and the moved load gets its own.
    if (isScalar(node) && node.anchor) keepForAliases(doc, node);
    load.set('connection', doc.createNode(asWritten(isScalar(value) ? value.value : undefined, targets[k]!)));
  });
  return doc.toString();
}

/** The same for an installation file (boards: [...]); one function serves both. */
export const rewriteInstallationText = rewriteBoardText;
