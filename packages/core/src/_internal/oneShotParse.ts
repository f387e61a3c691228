/**
 * The parse context of every schema check in core. Each schema checks one file, or one call's
 * options, a handful of times per process; zod's default compiles a specialised parser for each
 * object schema with `new Function` on its first parse, which pays off only over many parses of
 * the same shape. Without it the riverside board file validates in about 16 ms instead of 28 ms
 * (first parse in a fresh process, median of 8) and no generated code is evaluated. The result
 * (data and issues) is the same either way: it is one switch on zod's own two paths.
 */
export const ONE_SHOT_PARSE = { jitless: true } as const;
