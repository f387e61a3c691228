import fc from 'fast-check';
import { normaliseInstallation, parseInstallation, solveInstallationNetwork } from '../packages/core/src/index.js';
import { installationSpecArb } from '../test/property/arbitraries/installationSpec.js';
const [spec] = fc.sample(installationSpecArb({ systems: ['three-phase-4wire'], shapes: ['equal'], maxBoards: 3 }), { numRuns: 1, seed: 5 });
const { shape, ...file } = spec!;
console.log(JSON.stringify(file, null, 0));
const { installation } = normaliseInstallation(parseInstallation(file));
console.log(JSON.stringify(installation.subBoards.map(s => s.feeder)));
try { const s = solveInstallationNetwork(installation); console.log('ok', s.boards[0]!.lineCurrents); } catch (e) { console.log(String(e)); }
