/**
 * @trivar/core — exact solver for uneven single-phase loads on three-phase and
 * split-phase low-voltage boards. Every public function and type is named here.
 */

// Complex values and phasors
export type { ComplexValue, Phasor } from './complex.js';
// The helpers the studies call unchecked in their loops, exported with an entry check (see checkedHelpers.ts).
export {
  analyseSolution,
  bandDecimalsOf,
  busFigureTexts,
  idealSourceHolds,
  lowestInstallationVoltageChange,
  lowestVoltageChange,
  lowestVoltagePercentText,
  percentAgainstLevel,
  voltageBasisWords,
  worstBranch,
  branchAdmittanceAtOrder,
  capacitorVoltage,
  conventionsOf,
  degToRad,
  detunedOutputKvar,
  detunedSusceptance,
  deviationFromAveragePercent,
  dutyFigures,
  edgePowersAt,
  effectiveQuantities,
  formatPath,
  impedanceAtOrder,
  judgedNominalOf,
  labelIn,
  polar,
  powerReading,
  radToDeg,
  solveBatch,
  solveCompiledBoard,
  solveCompiledInstallation,
  stepCombinations,
  terminalVoltage,
  toPhasor,
  tuningOrder,
} from './checkedHelpers.js';

// Errors
export type { InputIssue } from './errors.js';
export { InputError, NumericalError } from './errors.js';
export { collapseError, assertViableBoard } from './analysis/viableOperatingPoint.js';

// Board files (the whole file with the studies' sections is composed in boardFile/)
export type { BoardSpec, LoadSpec } from './boardFile/boardFileSchema.js';
export type {
  SupplySpec,
  ConductorSpec,
  ImpedanceSpec,
  SystemKind,
  ConnectionSpec,
  LoadModelName,
} from './board/boardSchema.js';
export { CIRCUIT_MAX_CHARACTERS, NAME_MAX_CHARACTERS, PHYSICAL_RANGES } from './board/boardSchema.js';
export { boardSchema } from './boardFile/boardFileSchema.js';
export type { BoardValidation } from './boardFile/validateBoard.js';
export { validateBoard, parseBoard } from './boardFile/validateBoard.js';
export { parseBoardText } from './boardFile/parseBoardText.js';
export { readWellFormedBoard, readWellFormedInstallation } from './boardFile/boardFileRules.js';
export { readWellFormedCorrectionBoard } from './boardFile/wellFormedCorrectionBoard.js';
export { readBoardText } from './board/readBoardText.js';
export { readPlainBoardText, BOARD_TEXT_LIMITS } from './board/boardText.js';
export { boardJsonSchema, installationJsonSchema } from './boardFile/boardJsonSchema.js';
export { acceptedConnections } from './board/boardRules.js';
export type { Board, BoardLoad, LoadBranch, Terminal, ZipFractions, PhaseId } from './board/boardModel.js';
export { normaliseBoard } from './board/normaliseBoard.js';

// Installations (boards in a radial tree) and the cable library
export type { Installation, SubBoard, SubBoardFeeder, InstallationPlace, BankInService } from './board/boardModel.js';
export type { InstallationSpec, InstallationBoardSpec } from './boardFile/boardFileSchema.js';
export { installationSchema } from './boardFile/boardFileSchema.js';
export type { InstallationValidation } from './boardFile/validateInstallation.js';
export { validateInstallation, parseInstallation } from './boardFile/validateInstallation.js';
export { isInstallationInput } from './board/installationInput.js';
export { normaliseInstallation } from './board/normaliseInstallation.js';
export type { FeederSpec, PerPhaseConductorSpec, WindingSpec } from './board/boardSchema.js';
export type { ConductorMaterial, ConductorSize, ConductorResistance, ConductorReactance, ConduitKind } from './board/cableLibrary.js';
export { conductorReactance, conductorResistance, DEFAULT_CABLE_REACTANCE_OHM_PER_KM, DEFAULT_CONDUCTOR_TEMPERATURE_C } from './board/cableLibrary.js';
export { installationOf, boardOfInstallation, withoutBankOn } from './network/installationModel.js';
export type { InstallationSolution, CompiledInstallation } from './network/solveNetwork.js';
export { compileInstallation, solveInstallationNetwork } from './network/solveNetwork.js';
export type * from './analysis/installationResult.js';
export type { SolveInstallationOptions } from './analysis/solveInstallationModel.js';
export { solveInstallationModel } from './analysis/solveInstallationModel.js';
export { solveInstallation } from './boardFile/solveInstallation.js';

// Solving
export type { SolveOptions, NetworkSolution, BranchState } from './network/solveNetwork.js';
export { solveNetwork } from './network/solveNetwork.js';
export type { CompiledBoard } from './network/solveNetwork.js';
export { compileBoard } from './network/solveNetwork.js';
export type { CompiledNetwork } from './network/compiledNetwork.js';
export type { SolveBoardOptions } from './analysis/solveBoardModel.js';
export { solveBoardModel } from './analysis/solveBoardModel.js';
export { solveBoard } from './boardFile/solveBoard.js';

// Analysis
export type * from './analysis/boardResult.js';
export type { SequenceSet } from './analysis/symmetricalComponents.js';
export { sequenceComponents } from './analysis/symmetricalComponents.js';
export { unbalanceFactorFromLineMagnitudes, motorDeratingFactor } from './analysis/unbalanceIndices.js';
export type { BoardPowerDefinitions, ApparentPowerReading } from './analysis/powerDefinitions.js';
export { boardPowerDefinitions } from './analysis/powerDefinitions.js';
export { studyOpenNeutral } from './analysis/studyOpenNeutral.js';
export { OPEN_NEUTRAL_LIMITS, OPEN_NEUTRAL_METHOD, OPEN_NEUTRAL_COLUMN_KEY } from './analysis/openNeutralWording.js';
export type { NeutralBreakPath, FollowNeutralBreakOptions } from './analysis/followNeutralBreak.js';
export { followNeutralBreak, withNeutralFault } from './analysis/followNeutralBreak.js';
export type { NewtonOptions, NewtonOutcome } from './network/solveNetworkByNewton.js';
export { solveNetworkByNewton } from './network/solveNetworkByNewton.js';
export { WARNING_THRESHOLDS, OPEN_NEUTRAL_BAND } from './analysis/boardWarnings.js';
export { NOISE_FLOOR_RELATIVE } from './analysis/noiseFloor.js';
export { SUPPLY_LIMITS } from './analysis/readSupplyState.js';
export { sourceUnitsWords } from './analysis/sourceUnitsWords.js';

// Correction
export type {
  CorrectionSpec,
  TargetSpec,
  CapacitorUnitSpec,
  BankSpec,
  LightLoadSpec,
  CompensatorSpec,
  CapacitanceToleranceSpec,
  Arrangement,
  TargetDefinition,
  Practice,
  ControllerSpec,
  BalanceTargetSpec,
} from './correction/correctionSpec.js';
export { correctionSpecSchema } from './correction/correctionSpec.js';
export type { CorrectionSpecValidation } from './correction/validateCorrectionSpec.js';
export { validateCorrectionSpec, parseCorrectionSpec } from './correction/validateCorrectionSpec.js';
export { CORRECTION_DEFAULTS } from './correction/correctionDefaults.js';
export type { ResolvedTarget, TargetCheck, LineTargetCheck, BoardTargetDefinition } from './correction/correctionTarget.js';
export { resolveTarget, checkTarget, boardPowerFactor } from './correction/correctionTarget.js';
export type { BalanceTarget, BalanceCheck } from './correction/balanceTarget.js';
export { checkBalance } from './correction/balanceTarget.js';
export type { EquipmentGroup, EquipmentBranch, EquipmentTerminal, BranchSlot, AddEquipmentOptions } from './correction/equipment.js';
export { addCorrectionEquipment } from './correction/equipment.js';
export type { AppliedConditions, CapacitorOutput } from './correction/capacitorOutput.js';
export { capacitorOutput } from './correction/capacitorOutput.js';
export type { CatalogueUnit, TypicalCatalogue } from './correction/unitCatalogues.js';
export { TYPICAL_CATALOGUES } from './correction/unitCatalogues.js';
export { controllerSettings, responseThresholdA, standardCtPrimaryA } from './correction/controllerSettings.js';
export { scaleBoardLoads } from './correction/scaleBoardLoads.js';
export type { StarBankOptions } from './correction/sizeStarBank.js';
export { sizeStarBank } from './correction/sizeStarBank.js';
export type { DeltaBankOptions } from './correction/sizeDeltaBank.js';
export { sizeDeltaBank } from './correction/sizeDeltaBank.js';
export type { CompensatorOptions } from './correction/sizeBalancingCompensator.js';
export { sizeBalancingCompensator } from './correction/sizeBalancingCompensator.js';
export type { SelectBankUnitsOptions } from './correction/selectBankUnits.js';
export { selectBankUnits, defaultPractice } from './correction/selectBankUnits.js';
export type { VerifyCorrectionOptions } from './correction/verifyCorrection.js';
export { verifyCorrection } from './correction/verifyCorrection.js';
export { correctBoard } from './correction/correctBoard.js';
export type { CorrectionComparison, ArrangementOutcome, ArrangementFigures } from './correction/compareCorrections.js';
export { compareCorrections } from './correction/compareCorrections.js';
export type { InstallationCorrection, InstallationComparison, CorrectInstallationOptions, ReplacedBank, OtherBankInService, LeadingWithBanks } from './correction/correctInstallation.js';
export { correctInstallation, compareInstallationCorrections, installationBoardIndex } from './correction/correctInstallation.js';
export type { InstallationEffect, BoardEffect, IncomerLineEffect, OtherBoardWarning, SupplyEffect } from './correction/installationEffect.js';
export { installationEffect } from './correction/installationEffect.js';
export { ORIGIN_POINT, meteringPoints, meteringPointIssues } from './correction/meteringPoint.js';
export type * from './correction/correctionResult.js';
export { arrangementDescriptions, arrangementNames, BUILD_VERDICT_WORDS, CORRECTION_CAUTIONS, everyLineReadingWords, exemptLeadingLines, exemptLeadingWords, lossesPlaceWords, meteringPointWords, reactorChanges, smallBranchWords, sparedBranchesWords, stepStatesClearWords, stepStateTable } from './correction/correctionWording.js';
export type { StepStateTable } from './correction/correctionWording.js';
export { levelText, riseFigureText } from './correction/voltageRiseFlag.js';

// Load over time (trivar profile)
export type { ProfileSpec, ScenarioSpec, TariffSpec, ProfileBankSpec, BankStepSpec, ProfileLimitsSpec } from './profile/profileSpec.js';
export { profileSpecSchema } from './profile/profileSpec.js';
export { PROFILE_DEFAULTS } from './profile/profileDefaults.js';
export { belowTargetWords, contactorLifeWords, intervalSequenceWords } from './profile/profileWording.js';
export { billingPowerFactor, billingPowerFactorText } from './profile/billingPowerFactor.js';
export type { BatchNetwork, BatchEdge, DriverSpec, DriverColumns } from './profile/batchNetwork.js';
export { compileBatchNetwork } from './profile/batchNetwork.js';
export type { BatchKernel, IntervalState, KernelOptions } from './profile/batchKernel.js';
export type { IntervalFigures, BatchSolveOptions } from './profile/solveBatch.js';
export { allocateFigures, createBatchKernel } from './profile/solveBatch.js';
export type { ColumnPlan, ColumnTarget, ColumnPlanOptions, Quantity } from './profile/columnPlan.js';
export { planColumns, planDrivers, driverColumns } from './profile/columnPlan.js';
export type { RawIntervals, RowReader, RowReaderOptions } from './profile/readIntervalRows.js';
export { createRowReader } from './profile/readIntervalRows.js';
export type { GapFill, GapReading, SequenceReport, IntervalTable } from './profile/checkIntervalSequence.js';
export { GAP_FILLS, checkIntervalSequence, concatRawIntervals } from './profile/checkIntervalSequence.js';
export { isKnownTimeZone } from './profile/zoneClock.js';
export type { SwitchedStep, SwitchingSettings, StepChannel } from './profile/bankController.js';
export { createBankController } from './profile/bankController.js';
export { simulateBank } from './profile/simulateBank.js';
export type { MonthReading } from './profile/monthlyBilling.js';
export type { ProfileSummary, ConductorSummary, VoltageSummary, WorstInterval, ResolvedLimits } from './profile/summariseFigures.js';
export type { ProfileStudy, ProfileStudyInput, ProfileStudyOptions, ProfileResult, ProfileBankResult, BankStepRun } from './profile/studyProfile.js';
export type { ProfileBankResonance } from './profile/profileBankResonance.js';
export type { BelowTarget } from './profile/belowTargetHours.js';
export type { NeverClosedStep } from './profile/stepsNeverClosed.js';
export { studyProfile } from './profile/studyProfile.js';
export type { InstallationColumnPlan } from './profile/installationColumns.js';
export { planInstallationColumns } from './profile/installationColumns.js';
export type { InstallationBatchNetwork, InstallationEdge, InstallationKernel } from './profile/installationBatch.js';
export { compileInstallationBatch, createInstallationKernel, solveInstallationBatch } from './profile/installationBatch.js';
export type { InstallationProfileInput, InstallationProfileOptions, InstallationProfileBoard, InstallationProfileResult, InstallationProfileStudy } from './profile/studyInstallationProfile.js';
export { studyInstallationProfile } from './profile/studyInstallationProfile.js';
export type { ChartSeries, TimeChartInput, DurationChartInput } from './render/profileCharts.js';
export { renderTimeChart, renderDurationChart } from './render/profileCharts.js';

// Harmonics
export type * from './harmonics/harmonicsResult.js';
export type { SpectrumSpec, SpectrumEntrySpec, LinearForm, HarmonicsSectionSpec, InstalledBankSpec, HarmonicLoadSpec, HarmonicsBoardSpec, InstallationBankSpec, InstallationHarmonicsSectionSpec } from './harmonics/harmonicsSpec.js';
export { harmonicsSectionSchema, installationHarmonicsSectionSchema, MAX_ORDER } from './harmonics/harmonicsSpec.js';
export type { SpectrumKind, TypicalSpectrum } from './harmonics/typicalSpectra.js';
export { TYPICAL_SPECTRA, SPECTRUM_KINDS } from './harmonics/typicalSpectra.js';
export type { HarmonicModel, LoadBehaviour, OrderContent, BankModel } from './harmonics/harmonicModel.js';
export { resolveHarmonicModel, addInstalledBank, ordersPresent, stateKey } from './harmonics/harmonicModel.js';
export { solveAtOrder } from './harmonics/networkAtOrder.js';
export type { OrderSolution } from './harmonics/readHarmonics.js';
export type { HarmonicsOptions } from './harmonics/studyHarmonics.js';
export { studyBoardHarmonics, analyseHarmonics, solveHarmonicOrders, withSteps } from './harmonics/studyHarmonics.js';
export { studyHarmonics } from './boardFile/studyHarmonics.js';
export { studyInstallationHarmonics } from './boardFile/studyInstallationHarmonics.js';
export type { HarmonicsInstallationSpec, InstallationHarmonicModel, InstallationHarmonicsOptions, PlacedBank } from './harmonics/studyInstallationHarmonics.js';
export { studyInstallationHarmonicsSpec, resolveInstallationHarmonics, analyseInstallationHarmonics } from './harmonics/studyInstallationHarmonics.js';
export { withBanksInService } from './harmonics/banksInService.js';
export { bankInServiceWords, BANKS_IN_SERVICE_BASIS, listedBanksInService } from './analysis/banksInServiceWords.js';
export type { ListedBankInService } from './analysis/banksInServiceWords.js';
export { banksPlacementWords } from './correction/banksPlacementWords.js';
export type { BanksPlacement } from './correction/banksPlacementWords.js';
export { installationInService } from './boardFile/installationInService.js';
export { solveInstallationAtOrder, installationAtOrder } from './harmonics/installationAtOrder.js';
export { createInstallationScanEvaluator } from './harmonics/scanEvaluator.js';
export type { FixedInstallationInput } from './network/solveFixedInstallation.js';
export { solveFixedInstallation } from './network/solveFixedInstallation.js';
export type { ScanEvaluator, ScanEvaluatorOptions, ScanBank, BankState } from './harmonics/scanEvaluator.js';
export type { JointScanOptions, NetworkState } from './harmonics/scanJointResonance.js';
export { scanJointResonance, scanNetworkStates, controllerLevels, switchingLevels } from './harmonics/scanJointResonance.js';
export { scanResonance, createScanEvaluator, scanGrid, roundForPlot, shortCircuitVA } from './harmonics/scanResonance.js';
export { DUTY_LIMITS } from './harmonics/capacitorDuty.js';
export { dutyConditions, withCapacitanceFactor, withLoadsOff, withOtherBanksOff, conditionWords } from './harmonics/dutyConditions.js';
export { DETUNING_FACTORS_PERCENT } from './harmonics/detuning.js';
export { ieee519OrderLimit, ieee519Row } from './harmonics/ieee519.js';
export { HARMONICS_DEFAULTS } from './harmonics/harmonicsDefaults.js';
export { HARMONICS_CAUTIONS, jointCoverageWords, nearestWords } from './harmonics/harmonicsWording.js';
export type { VoltageDistortionBasis, VoltageDistortionLimits } from './harmonics/voltageDistortionLimits.js';
export { VOLTAGE_DISTORTION_BASES, VOLTAGE_DISTORTION_LIMITS, regionVoltageDistortionBasis } from './harmonics/voltageDistortionLimits.js';
export type { FixedNetworkInput, FixedSolveOptions } from './network/solveFixedNetwork.js';
export { CompiledNetworkCache } from './network/compiledNetworkCache.js';
export { solveFixedNetwork } from './network/solveFixedNetwork.js';
export type { NodalMatrix } from './network/terminalImpedance.js';
export type { CorrectionVariant, CorrectionHarmonics, HarmonicCorrectionReport, ArrangementHarmonics, HarmonicComparison } from './harmonics/correctWithHarmonics.js';
export { correctWithHarmonics, compareWithHarmonics, bankOfReport } from './harmonics/correctWithHarmonics.js';
export type { InstallationHarmonicCorrection, InstallationHarmonicComparison, ResonanceWithoutBank } from './harmonics/correctInstallationWithHarmonics.js';
export { correctInstallationWithHarmonics, compareInstallationWithHarmonics } from './harmonics/correctInstallationWithHarmonics.js';
export { boardHasHarmonicData, installationHasHarmonicData } from './harmonics/boardHasHarmonicData.js';

// Rebalancing (which circuits to move to which phase)
export type { RebalanceSpec, AimSpec, AimFigure, LoadConditionSpec, PinSpec } from './rebalance/rebalanceSpec.js';
export { rebalanceSpecSchema, AIM_FIGURES } from './rebalance/rebalanceSpec.js';
export type { ConditionFigures, RebalanceObjective } from './rebalance/rebalanceObjective.js';
export type { RebalanceOptions } from './rebalance/rebalanceBoard.js';
export { rebalanceBoard } from './rebalance/rebalanceBoard.js';
export { rebalanceInstallation } from './rebalance/rebalanceInstallation.js';
export { conditionsFromScenarios } from './rebalance/rebalanceRules.js';
export { conditionsFromIntervals } from './rebalance/intervalConditions.js';
export { conditionsFromInstallationIntervals } from './rebalance/installationIntervalConditions.js';
export type { InstallationIntervalConditions } from './rebalance/installationIntervalConditions.js';
export type { IntervalConditions, IntervalConditionOptions, IntervalPick, LoadConditionInput } from './rebalance/intervalConditions.js';
export { rewriteInstallationText } from './rebalance/rewriteBoardText.js';
export type * from './rebalance/rebalanceResult.js';
export type { MovedCircuitNumber } from './rebalance/movedCircuitNumber.js';
export { REBALANCE_CAUTIONS } from './rebalance/rebalanceWording.js';
export { rewriteBoardText } from './rebalance/rewriteBoardText.js';
export { withHarmonicNeutral } from './boardFile/rebalanceHarmonicNeutral.js';

// Drawings and reports (SVG/HTML/Markdown text; the CLI writes the files)
export type { PhasorDiagramOptions } from './render/renderPhasorDiagram.js';
export { renderPhasorDiagram } from './render/renderPhasorDiagram.js';
export { powerFactorText, displacementPfText, isExportKW, signedPfText, assumedPfNote, linePfText, exportingLinesNote, isExportCurrentA } from './render/powerFactorText.js';
export type { SequenceDiagramOptions } from './render/renderSequenceDiagram.js';
export { renderSequenceDiagram } from './render/renderSequenceDiagram.js';
export type { CurrentTriangleOptions, LineCurrentParts } from './render/renderCurrentTriangles.js';
export { renderCurrentTriangles, lineCurrentParts } from './render/renderCurrentTriangles.js';
export { renderImpedanceScan } from './render/renderImpedanceScan.js';
export type { OneLineDiagramOptions } from './render/renderOneLineDiagram.js';
export { renderOneLineDiagram, ONE_LINE_LAYOUT } from './render/renderOneLineDiagram.js';
export type { ReportDocument, ReportSection, ReportBlock, ReportColumn } from './render/report/reportDocument.js';
export type { BoardReportInput } from './render/report/buildBoardReport.js';
export { buildBoardReport } from './render/report/buildBoardReport.js';
export type { InstallationReportInput } from './render/report/buildInstallationReport.js';
export { buildInstallationReport } from './render/report/buildInstallationReport.js';
export { handCheckSection, handCheckEffectRows, handCheckComparedRows } from './render/report/handCheckSection.js';
export type { ReportHtmlOptions } from './render/report/renderReportHtml.js';
export { renderReportHtml } from './render/report/renderReportHtml.js';
export type { MarkdownReport } from './render/report/renderReportMarkdown.js';
export { renderReportMarkdown } from './render/report/renderReportMarkdown.js';
export type { ProfileChart } from './render/report/profileSection.js';
export { profileSection, installationProfileSections } from './render/report/profileSection.js';
export { boardSectionIds } from './render/report/installationSections.js';
export { harmonicsSection } from './render/report/harmonicsSection.js';
export { installationHarmonicsSections } from './render/report/installationHarmonicsSections.js';

// Checking hand calculations (trivar check)
export type { HandFiguresSpec, HandCapacitorSpec, HandBranch } from './handCheck/handFiguresSpec.js';
export { handFiguresSchema } from './handCheck/handFiguresSpec.js';
export { parseHandFigures } from './handCheck/validateHandFigures.js';
export type * from './handCheck/handCheckResult.js';
export { checkHandFigures, addHandCapacitors } from './handCheck/checkHandFigures.js';
export { textbookWorking } from './handCheck/textbookWorking.js';
export type { ScenarioReading, ScenarioResult, BoardScenarios } from './profile/studyScenarios.js';
export { studyScenarios } from './profile/studyScenarios.js';
export type { ScenarioTariff } from './profile/scenarioTariff.js';
export type { InstallationScenarioBoard, InstallationScenarioResult } from './profile/studyInstallationScenarios.js';
export { studyInstallationScenarios } from './profile/studyInstallationScenarios.js';
export type { BankDesign, SwitchingFromBank } from './profile/switchingFromBank.js';
export { switchingFromBank } from './profile/switchingFromBank.js';
// Regional conventions: phase names, voltage notation, voltage limits, region wording.
export type { PhaseNaming, PhaseLabel, PhaseLabeller } from './board/conventions/phaseNames.js';
export { PHASE_NAMINGS, labellerOf, phaseLabels } from './board/conventions/phaseNames.js';
export type { VoltageNotation, NotationReading } from './board/conventions/voltageNotation.js';
export { readVoltageNotation, writeVoltageNotation, NOTATION_RATIO_TOLERANCE } from './board/conventions/voltageNotation.js';
export type { VoltageLimits, VoltageLimitPreset, VoltageLimitPresetName } from './board/conventions/voltageLimits.js';
export { VOLTAGE_LIMIT_PRESETS, VOLTAGE_ROUND_OFF_PERCENT, judgeVoltage, bandVolts, bandVoltsWords, bandWords } from './board/conventions/voltageLimits.js';
export type { BandSide, VoltageShown } from './board/conventions/voltageBesideBand.js';
export { voltageBesideBand, percentBesideBand, percentBesideEdges } from './board/conventions/voltageBesideBand.js';
export type { VoltageUnbalanceLimit } from './board/conventions/unbalanceLimits.js';
export { VOLTAGE_UNBALANCE_LIMITS, unbalanceFigure } from './board/conventions/unbalanceLimits.js';
export { judgedNominals } from './analysis/voltageCheck.js';
export { STANDARD_STAR_PAIRS } from './board/nominalVoltages.js';
export { nominalVoltageWords, nonStandardNominalNote, sourceHeldLine, sourceVoltageWords } from './render/nominalVoltageWords.js';
export type { Region, RegionBasis } from './board/conventions/region.js';
export { inferRegion } from './board/conventions/region.js';
export type { BoardConventions } from './board/conventions/boardConventions.js';
export type { VoltageCheck, VoltageExtreme } from './analysis/voltageCheck.js';
export type { RegionWords, StarWord, SourceModel } from './board/conventions/regionWords.js';
export { regionWords, starWordOf } from './board/conventions/regionWords.js';
