/** The shortcut's copy of the schema's ranges and word lists (boardRanges.ts) equals the schema's own (boardSchema.ts). */
import { describe, expect, it } from 'vitest';
import * as ranges from '../../packages/core/src/board/boardRanges.js';
import * as schema from '../../packages/core/src/board/boardSchema.js';

describe('boardRanges', () => {
  it('holds the same physical ranges, systems, connections and load models as the schema', () => {
    expect(ranges.PHYSICAL_RANGES).toStrictEqual(schema.PHYSICAL_RANGES);
    expect(ranges.SYSTEMS).toStrictEqual(schema.SYSTEMS);
    expect(ranges.CONNECTIONS).toStrictEqual(schema.CONNECTIONS);
    expect(ranges.LOAD_MODELS).toStrictEqual(schema.LOAD_MODELS);
  });
});
