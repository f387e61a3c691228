/** A report document as Markdown, with each figure as an SVG file to write beside it. */
import type { ReportBlock, ReportDocument } from './reportDocument.js';
import { visibleControls } from '../svgText.js';

export interface MarkdownReport {
  readonly markdown: string;
  /** Files the Markdown links to, named `<prefix>-<figure>.svg`. */
  readonly files: readonly { readonly name: string; readonly content: string }[];
}

/**
 * Markdown special characters in table cells and text that would change the layout. Angle brackets
 * in both: a renderer passes raw HTML through, in a table cell as anywhere (a circuit named
 * `<img onerror=…>` must print as text, not run).
 */
const cell = (text: string): string => visibleControls(text.replace(/([\\|<>])/g, '\\$1'));
const text = (t: string): string => visibleControls(t.replace(/([\\`*_[\]<>])/g, '\\$1'));

/**
 * Renders a report as Markdown.
 * @param figurePrefix start of each figure's file name (usually the report's own base name)
 */
export function renderReportMarkdown(doc: ReportDocument, figurePrefix: string): MarkdownReport {
  const files: { name: string; content: string }[] = [];
  const block = (b: ReportBlock): string => {
    switch (b.kind) {
      case 'paragraph':
        return text(b.text);
      case 'facts':
        return b.items.map(([k, v]) => `- **${text(k)}:** ${text(v)}`).join('\n');
      case 'table': {
        const head = `| ${b.columns.map((c) => cell(c.label)).join(' | ')} |`;
        const rule = `| ${b.columns.map((c) => (c.align === 'right' ? '---:' : ':---')).join(' | ')} |`;
        const rows = b.rows.map((r) => `| ${r.map(cell).join(' | ')} |`);
        return [`**${text(b.caption)}**`, '', head, rule, ...rows, ...(b.note ? ['', `_${text(b.note)}_`] : [])].join('\n');
      }
      case 'figure': {
        const name = `${figurePrefix}-${b.name}.svg`;
        files.push({ name, content: b.svg });
        return `![${cell(b.caption)}](${encodeURI(name)})`;
      }
      case 'list': {
        const mark = b.tone === 'caution' ? '**Caution:** ' : b.tone === 'warning' ? '**Warning:** ' : '';
        return b.items.map((i) => `- ${mark}${text(i)}`).join('\n');
      }
    }
  };
  const body = doc.sections.map((s) => `## ${text(s.title)}\n\n${s.blocks.map(block).join('\n\n')}`).join('\n\n');
  return { markdown: `# ${text(doc.title)}\n\n${text(doc.subtitle)}\n\n${body}\n`, files };
}
