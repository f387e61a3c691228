/** The views `trivar diagram` draws; apart from the command so the option list loads without it. */
export const DIAGRAM_VIEWS = ['phasors', 'sequence', 'triangles', 'one-line'] as const;
export type DiagramView = (typeof DIAGRAM_VIEWS)[number];
