/**
 * A North-American conductor size written close to, but not as, the file's spelling: `awg: 4`
 * (a number), `awg: "AWG 2"`, `awg: "#4"`, `awg: "0000"`, `awg: "250 kcmil"`, `kcmil: "4/0"`. The
 * error then says how the file writes that size. Only a spelling that names one size of the cable
 * library's NEC table is suggested; anything else gets the rule alone. Nothing is accepted here:
 * the file is still refused, so a misread size never reaches a figure.
 */
import type { InputIssue } from '../errors.js';
import { tabulatedSizes, type ConductorMaterial } from './cableLibrary.js';

const SPELLING = 'AWG sizes are text ("14" … "1", then "1/0" … "4/0"), larger sizes a kcmil number (kcmil: 250)';
const YAML_QUOTES = 'in YAML quote it, since an unquoted 4 or 0000 is read as a number';
/** Zeros for the aught sizes: 0 = 1/0 … 0000 = 4/0. */
const AUGHTS: Readonly<Record<string, string>> = { '0': '1/0', '00': '2/0', '000': '3/0', '0000': '4/0' };

const awgSizes = (material: ConductorMaterial): string[] => tabulatedSizes({ awg: '' }, material);
const kcmilSizes = (material: ConductorMaterial): number[] => tabulatedSizes({ kcmil: 0 }, material).map((k) => Number.parseFloat(k));

/** The size a loose spelling names, as the file writes it (`awg: "2"`, `kcmil: 250`), or null. */
function writtenAs(text: string, material: ConductorMaterial): string | null {
  const plain = text
    .trim()
    .replace(/^#\s*/, '')
    .replace(/^(awg|ga|gauge|no\.?)\s*/i, '')
    .replace(/\s*(awg|ga|gauge)$/i, '')
    .trim();
  const kcmil = /^(\d+(?:\.\d+)?)\s*(kcmil|mcm)?$/i.exec(plain);
  const aught = AUGHTS[plain] ?? (/^(\d)\s*\/\s*0$/.test(plain) ? `${plain[0]}/0` : plain);
  if (awgSizes(material).includes(aught)) return `awg: "${aught}"`;
  if (kcmil && kcmilSizes(material).includes(Number(kcmil[1]))) return `kcmil: ${Number(kcmil[1])}`;
  return null;
}

/** What to write for a size field's value, or null when it names no size of the table. */
export function conductorSizeSuggestion(field: 'awg' | 'kcmil', value: unknown, material: ConductorMaterial): string | null {
  if (typeof value === 'number') {
    // YAML reads 0, 00, 000 and 0000 all as 0: which aught size was meant cannot be told.
    if (field === 'awg' && value === 0) return null;
    return writtenAs(String(value), material);
  }
  return typeof value === 'string' ? writtenAs(value, material) : null;
}

/** The hint appended to a size error: the suggestion when there is one, the spelling rule, and the YAML note. */
export function conductorSizeHint(field: 'awg' | 'kcmil', value: unknown, material: ConductorMaterial): string {
  const suggestion = conductorSizeSuggestion(field, value, material);
  const zero = field === 'awg' && value === 0 ? '; YAML reads 0, 00, 000 and 0000 alike as the number 0, so write the size quoted ("1/0" … "4/0")' : '';
  return `${suggestion ? `; write ${suggestion}` : ''}${zero}; ${SPELLING}${field === 'awg' && !zero ? `; ${YAML_QUOTES}` : ''}`;
}

const SIZE_FIELD = /\.(awg|kcmil)$/;

/** The value at a path as issues write it (`boards[1].feeder.line.A.awg`), or undefined. */
function valueAt(root: unknown, path: string): unknown {
  let node = root;
  for (const key of path.split(/\.|(?=\[)/)) {
    if (node === null || typeof node !== 'object') return undefined;
    const index = /^\[(\d+)\]$/.exec(key);
    node = index ? (node as unknown[])[Number(index[1])] : (node as Record<string, unknown>)[key];
  }
  return node;
}

/**
 * A schema issue on an AWG or kcmil field (`awg: 4` is a number, `kcmil: "250"` a text) gets the
 * same hint as a size the table lacks; `input` is the file as the schema read it.
 */
export function withConductorSizeHints(issues: readonly InputIssue[], input: unknown): InputIssue[] {
  return issues.map((issue) => {
    const field = SIZE_FIELD.exec(issue.path)?.[1] as 'awg' | 'kcmil' | undefined;
    if (!field || issue.code !== 'invalid_type') return issue;
    const conductor = valueAt(input, issue.path.slice(0, -field.length - 1));
    const material = conductor !== null && typeof conductor === 'object' && (conductor as { material?: unknown }).material === 'aluminium' ? 'aluminium' : 'copper';
    const hint = conductorSizeHint(field, valueAt(input, issue.path), material);
    const head = `${issue.path}: expected ${issue.expected}`;
    return { ...issue, expected: `${issue.expected}${hint}`, message: issue.message.startsWith(head) ? `${head}${hint}${issue.message.slice(head.length)}` : issue.message };
  });
}
