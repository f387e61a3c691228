/**
 * Bytes of a board source → text. Board files are UTF-8 (a byte-order mark is
 * allowed); UTF-16 with a byte-order mark is decoded too, since some Windows
 * editors save that way. Anything else is refused with a hint, never read as mojibake.
 */
import { EXIT, UsageError } from './exitCodes.js';

const refuse = (source: string, why: string) => new UsageError(`cannot read ${source}: ${why}`, EXIT.input);

function startsWith(bytes: Uint8Array, ...prefix: number[]): boolean {
  return prefix.every((b, k) => bytes[k] === b);
}

function lineOfOffset(text: string, offset: number): number {
  let line = 1;
  for (let k = 0; k < offset; k++) if (text.charCodeAt(k) === 10) line++;
  return line;
}

/** Mostly-ASCII text in UTF-16 without a byte-order mark: a zero in every other byte, on one side only. */
function looksLikeUtf16(bytes: Uint8Array): boolean {
  const pairs = Math.min(256, Math.floor(bytes.length / 2));
  if (pairs < 2) return false;
  let lowZero = 0;
  let highZero = 0;
  for (let k = 0; k < pairs; k++) {
    const a = bytes[2 * k]!;
    const b = bytes[2 * k + 1]!;
    if (a !== 0 && b === 0) lowZero++;
    if (a === 0 && b !== 0) highZero++;
  }
  return Math.max(lowZero, highZero) >= 0.9 * pairs;
}

export function decodeBoardBytes(bytes: Uint8Array, source: string): string {
  if (startsWith(bytes, 0xff, 0xfe, 0, 0) || startsWith(bytes, 0, 0, 0xfe, 0xff))
    throw refuse(source, 'the file is UTF-32 text; save it as UTF-8');
  if (startsWith(bytes, 0xff, 0xfe)) return new TextDecoder('utf-16le').decode(bytes.subarray(2));
  if (startsWith(bytes, 0xfe, 0xff)) return new TextDecoder('utf-16be').decode(bytes.subarray(2));
  const nul = bytes.indexOf(0);
  if (nul >= 0) {
    if (looksLikeUtf16(bytes))
      throw refuse(source, 'the file looks like UTF-16 text without a byte-order mark; save it as UTF-8');
    throw refuse(source, `the file is binary, not text (a zero byte at offset ${nul}); a board file is YAML or JSON text in UTF-8`);
  }
  try {
    return new TextDecoder('utf-8', { fatal: true, ignoreBOM: false }).decode(bytes);
  } catch {
    const lossy = new TextDecoder('utf-8').decode(bytes);
    const at = lossy.indexOf('\uFFFD');
    throw refuse(source, `the file is not UTF-8 text (an invalid byte sequence on line ${lineOfOffset(lossy, at)}); save it as UTF-8`);
  }
}
