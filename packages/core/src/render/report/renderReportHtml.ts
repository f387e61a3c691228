/** A report document as one self-contained HTML file: inline CSS and SVG, no scripts, no network. */
import { escapeXml } from '../svgText.js';
import type { ReportBlock, ReportDocument } from './reportDocument.js';
import { REPORT_CSS } from './reportStyles.js';
import { checkListArgument, checkObjectArgument } from '../../_internal/argumentChecks.js';

export interface ReportHtmlOptions {
  /** Footer line, e.g. the program and version that made the report. @defaultValue 'Made with trivar' */
  readonly footer?: string;
}

function block(b: ReportBlock): string {
  switch (b.kind) {
    case 'paragraph':
      return `<p>${escapeXml(b.text)}</p>`;
    case 'facts':
      return `<dl class="facts">${b.items.map(([k, v]) => `<dt>${escapeXml(k)}</dt><dd>${escapeXml(v)}</dd>`).join('')}</dl>`;
    case 'table': {
      const cls = (k: number) => (b.columns[k]?.align === 'right' ? ' class="num"' : '');
      const head = b.columns.map((c, k) => `<th scope="col"${cls(k)}>${escapeXml(c.label)}</th>`).join('');
      const body = b.rows.map((r) => `<tr>${r.map((cell, k) => `<td${cls(k)}>${escapeXml(cell)}</td>`).join('')}</tr>`).join('\n');
      const note = b.note ? `\n<p class="table-note">${escapeXml(b.note)}</p>` : '';
      return `<div class="table-wrap"><table><caption>${escapeXml(b.caption)}</caption><thead><tr>${head}</tr></thead><tbody>\n${body}\n</tbody></table></div>${note}`;
    }
    case 'figure':
      // The SVG comes from trivar's own renderers (every text in it escaped), so it is inlined as is.
      return `<figure data-figure="${escapeXml(b.name)}">${b.svg.trim()}<figcaption>${escapeXml(b.caption)}</figcaption></figure>`;
    case 'list':
      return `<ul class="tone-${b.tone ?? 'plain'}">${b.items.map((i) => `<li>${escapeXml(i)}</li>`).join('')}</ul>`;
  }
}

/**
 * Renders a report as HTML text.
 * @example
 * renderReportHtml(buildBoardReport({ spec, result })).startsWith('<!DOCTYPE html>') //=> true
 */
export function renderReportHtml(doc: ReportDocument, options: ReportHtmlOptions = {}): string {
  checkObjectArgument(doc, 'doc', 'a report document from buildBoardReport(...) or buildInstallationReport(...)', ['sections']);
  checkListArgument(doc.sections, 'doc.sections', 'the list of report sections', (x) => typeof x === 'object' && x !== null);
  const contents = doc.sections.map((s) => `<li><a href="#${escapeXml(s.id)}">${escapeXml(s.title)}</a></li>`).join('');
  const sections = doc.sections
    .map((s) => `<section id="${escapeXml(s.id)}">\n<h2>${escapeXml(s.title)}</h2>\n${s.blocks.map(block).join('\n')}\n</section>`)
    .join('\n');
  return `<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>${escapeXml(doc.title)}</title>
<style>${REPORT_CSS}</style>
</head>
<body>
<header class="report-head"><h1>${escapeXml(doc.title)}</h1><p>${escapeXml(doc.subtitle)}</p></header>
<nav class="contents" aria-label="Contents"><ol>${contents}</ol></nav>
${sections}
<footer>${escapeXml(options.footer ?? 'Made with trivar')}</footer>
</body>
</html>
`;
}
