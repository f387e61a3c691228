/** Which kind of file a parsed board file is; kept apart from the schemas so the command line can ask without loading them. */

/** True when a parsed file describes an installation (it has `boards`) rather than one board. */
export const isInstallationInput = (input: unknown): boolean => typeof input === 'object' && input !== null && 'boards' in input;
