/**
 * The report's stylesheet, inlined in every HTML report (no network). The
 * print rules fit the narrower of A4 and US Letter: the page box follows the
 * printer's paper, margins are set so the text block is at most 182 mm wide
 * (A4 210 mm − 2 × 14 mm), and figures and table rows are not split.
 */
export const REPORT_CSS = `
:root { --ink: #1a1a1a; --muted: #555; --rule: #c9c9c9; --accent: #0072b2; --band: #f3f6f8; --warn: #8a4b00; --caution: #7a1f5c; }
* { box-sizing: border-box; }
html { font-family: "DejaVu Sans", "Liberation Sans", Arial, sans-serif; color: var(--ink); background: #fff; }
body { margin: 0 auto; max-width: 60rem; padding: 1.5rem 1.25rem 3rem; font-size: 14px; line-height: 1.45; }
header.report-head { border-bottom: 3px solid var(--ink); padding-bottom: .6rem; margin-bottom: 1rem; }
header.report-head h1 { font-size: 1.6rem; margin: 0; }
header.report-head p { margin: .2rem 0 0; color: var(--muted); }
nav.contents ol { columns: 2; margin: .4rem 0 1rem; padding-left: 1.4rem; color: var(--muted); }
nav.contents a { color: inherit; }
section { margin: 1.6rem 0 0; }
h2 { font-size: 1.15rem; margin: 0 0 .6rem; padding: .15rem 0 .15rem .55rem; border-left: 5px solid var(--accent); }
dl.facts { display: grid; grid-template-columns: minmax(12rem, max-content) 1fr; gap: .15rem 1rem; margin: .4rem 0 .8rem; }
dl.facts dt { color: var(--muted); }
dl.facts dd { margin: 0; }
.table-wrap { max-width: 100%; overflow-x: auto; margin: .4rem 0 .9rem; }
table { border-collapse: collapse; width: 100%; font-size: .86rem; }
caption { text-align: left; font-weight: bold; padding-bottom: .3rem; }
th, td { padding: .22rem .45rem; border-bottom: 1px solid var(--rule); vertical-align: top; overflow-wrap: anywhere; }
th { text-align: left; border-bottom: 2px solid var(--ink); font-weight: bold; }
th.num, td.num { text-align: right; font-variant-numeric: tabular-nums; white-space: nowrap; overflow-wrap: normal; }
tbody tr:nth-child(even) td { background: var(--band); }
p.table-note { font-size: .8rem; color: var(--muted); margin: -.5rem 0 .9rem; }
figure { margin: .8rem 0 1.2rem; text-align: center; }
figure svg { max-width: 100%; height: auto; }
figcaption { font-size: .85rem; color: var(--muted); margin-top: .2rem; }
ul.tone-warning li::marker { content: "▲ "; color: var(--warn); }
ul.tone-caution { border: 1.5px solid var(--caution); padding: .6rem .8rem .6rem 2rem; border-radius: 3px; }
ul.tone-caution li::marker { content: "! "; color: var(--caution); font-weight: bold; }
footer { margin-top: 2rem; border-top: 1px solid var(--rule); padding-top: .5rem; font-size: .8rem; color: var(--muted); }
@page { margin: 14mm; }
@media print {
  body { max-width: none; padding: 0; font-size: 9.5pt; }
  nav.contents { display: none; }
  h2 { break-after: avoid; }
  figure, tr, dl.facts, ul.tone-caution { break-inside: avoid; }
  figure svg { max-height: 120mm; width: auto; }
  /* A one-line drawing is tall and its text small: it may take most of a page (A4 text block 269 mm). */
  figure svg[data-view="one-line"] { max-height: 235mm; }
  .table-wrap { overflow: visible; }
  table { font-size: 8pt; }
  p.table-note, figcaption { font-size: 7.5pt; }
  th, td { padding: .12rem .3rem; }
  tbody tr:nth-child(even) td { background: none; }
  a { color: inherit; text-decoration: none; }
}
`;
