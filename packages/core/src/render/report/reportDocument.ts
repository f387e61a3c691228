/**
 * A report as plain data: titled sections of blocks (facts, tables, figures,
 * lists). One document renders to HTML or Markdown; a study adds its findings
 * by handing over a `ReportSection` (the extension point for studies that
 * come later: harmonics, load profiles…).
 */

export interface ReportColumn {
  readonly label: string;
  /** Numbers right, words left. @defaultValue 'left' */
  readonly align?: 'left' | 'right';
}

export type ReportBlock =
  | { readonly kind: 'paragraph'; readonly text: string }
  /** Label–value pairs (a description list). */
  | { readonly kind: 'facts'; readonly items: readonly (readonly [string, string])[] }
  | { readonly kind: 'table'; readonly caption: string; readonly columns: readonly ReportColumn[]; readonly rows: readonly (readonly string[])[]; readonly note?: string }
  /** An inline SVG drawing; `name` is short and file-safe (used for files beside a Markdown report). */
  | { readonly kind: 'figure'; readonly name: string; readonly caption: string; readonly svg: string }
  | { readonly kind: 'list'; readonly items: readonly string[]; readonly tone?: 'plain' | 'caution' | 'warning' };

export interface ReportSection {
  /** Stable id (anchor in HTML): `installation`, `schedule`, `results`… */
  readonly id: string;
  readonly title: string;
  readonly blocks: readonly ReportBlock[];
}

export interface ReportDocument {
  readonly title: string;
  readonly subtitle: string;
  readonly sections: readonly ReportSection[];
}
