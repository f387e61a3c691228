/**
 * A number as `toLocaleString('en')` writes it (thousands grouped with commas), for the
 * messages the board schema builds when its module loads: the first `toLocaleString` call
 * loads ICU's number formatting, 15–40 ms of every CLI start. Numbers this cannot write
 * exactly the same way (more than 3 decimals, exponents, -0) go to `toLocaleString`.
 */
export function groupDigits(x: number): string {
  const text = String(Math.abs(x));
  const [whole = '', fraction] = text.split('.');
  if (!Number.isFinite(x) || Object.is(x, -0) || text.includes('e') || (fraction !== undefined && fraction.length > 3)) return x.toLocaleString('en');
  let grouped = '';
  for (let end = whole.length; end > 0; end -= 3) grouped = whole.slice(Math.max(0, end - 3), end) + (grouped ? `,${grouped}` : '');
  return `${x < 0 ? '-' : ''}${grouped}${fraction === undefined ? '' : `.${fraction}`}`;
}
