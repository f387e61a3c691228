/**
 * What `trivar solve` and `trivar correct` load only for YAML outside the plain subset (anchors, block scalars,
 * multi-line values...) or text with a syntax error: yaml's reader (core's readBoardText).
 */
export { readBoardText } from '@trivar/core';
