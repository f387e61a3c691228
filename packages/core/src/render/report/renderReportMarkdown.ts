/** A report document as Markdown, with each figure as an SVG file to write beside it. */
import type { ReportBlock, ReportDocument } from './reportDocument.js';
import { visibleControls } from '../svgText.js';
import { checkListArgument, checkObjectArgument, checkTextArgument } from '../../_internal/argumentChecks.js';

export interface MarkdownReport {
  readonly markdown: string;
  /** Files the Markdown links to, named `<prefix>-<figure>.svg`. */
  readonly files: readonly { readonly name: string; readonly content: string }[];
}

/**
 * Every character Markdown (CommonMark with the GitHub extensions) acts on inside a line, escaped
 * with a backslash wherever the report writes text, table cells and prose alike: names come from the
 * file, and a load named `![t](https://…)` must print as text, not fetch a remote image, nor
 * `[x](javascript:…)` make a link. [ ] ! make links and images; * _ ` ~ emphasis, code and
 * strike-through; < > raw HTML and autolinks (a renderer passes HTML through, in a table cell as
 * anywhere); & entities; # headings; $ maths on renderers that have it; \ itself.
 * ( ) are not active without a [ ] before them; - + = and "1." only at a line's start: escaped there in
 * a paragraph, the one block whose text starts a line.
 */
const MARKDOWN_ACTIVE = /[\\`*_[\]!<>&#~$]/g;
const escapeMarkdown = (t: string): string => visibleControls(t.replace(MARKDOWN_ACTIVE, '\\$&'));
/** In a table cell | also ends the cell; elsewhere (one-line blocks, no table around) it is text. */
const escapeCell = (t: string): string => escapeMarkdown(t).replace(/\|/g, '\\|');
const escapeParagraph = (t: string): string => escapeMarkdown(t).replace(/^([-+=])/, '\\$1').replace(/^(\d+)([.)])/, '$1\\$2');

/**
 * Renders a report as Markdown.
 * @param figurePrefix start of each figure's file name (usually the report's own base name)
 */
export function renderReportMarkdown(doc: ReportDocument, figurePrefix: string): MarkdownReport {
  checkObjectArgument(doc, 'doc', 'a report document from buildBoardReport(...) or buildInstallationReport(...)', ['sections']);
  checkListArgument(doc.sections, 'doc.sections', 'the list of report sections', (x) => typeof x === 'object' && x !== null);
  checkTextArgument(figurePrefix, 'figurePrefix', 'the prefix of the figure files, a string (e.g. "report")');
  const files: { name: string; content: string }[] = [];
  const block = (b: ReportBlock): string => {
    switch (b.kind) {
      case 'paragraph':
        return escapeParagraph(b.text);
      case 'facts':
        return b.items.map(([k, v]) => `- **${escapeMarkdown(k)}:** ${escapeMarkdown(v)}`).join('\n');
      case 'table': {
        const head = `| ${b.columns.map((c) => escapeCell(c.label)).join(' | ')} |`;
        const rule = `| ${b.columns.map((c) => (c.align === 'right' ? '---:' : ':---')).join(' | ')} |`;
        const rows = b.rows.map((r) => `| ${r.map(escapeCell).join(' | ')} |`);
        return [`**${escapeMarkdown(b.caption)}**`, '', head, rule, ...rows, ...(b.note ? ['', `_${escapeMarkdown(b.note)}_`] : [])].join('\n');
      }
      case 'figure': {
        const name = `${figurePrefix}-${b.name}.svg`;
        files.push({ name, content: b.svg });
        return `![${escapeMarkdown(b.caption)}](${encodeURI(name)})`;
      }
      case 'list': {
        const mark = b.tone === 'caution' ? '**Caution:** ' : b.tone === 'warning' ? '**Warning:** ' : '';
        return b.items.map((i) => `- ${mark}${escapeMarkdown(i)}`).join('\n');
      }
    }
  };
  const body = doc.sections.map((s) => `## ${escapeMarkdown(s.title)}\n\n${s.blocks.map(block).join('\n\n')}`).join('\n\n');
  return { markdown: `# ${escapeMarkdown(doc.title)}\n\n${escapeMarkdown(doc.subtitle)}\n\n${body}\n`, files };
}
