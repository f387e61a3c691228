/** The shipped ferrybank-joinery installation, and it with the banks its harmonics section lists taken in service (as trivar solve has it). */
import { readFileSync } from 'node:fs';
import { installationInService, parseInstallation, readBoardText, type InstallationSpec } from '@trivar/core';

export const ferrybankSpec = parseInstallation(readBoardText(readFileSync(new URL('../../examples/ferrybank-joinery.yaml', import.meta.url), 'utf8'))) as InstallationSpec;
export const ferrybankInService = installationInService(ferrybankSpec);
