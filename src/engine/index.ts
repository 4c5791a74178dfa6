// The engine's only public surface. Pure TypeScript: no Office, no DOM, no Node I/O.
export { EngineError, isEngineError } from "./errors";
export type { EngineErrorCode } from "./errors";

export { boxCox, boxCoxInverse, boxCoxInverseDetailed, boxCoxShifted, boxCoxShiftedInverse, LAMBDA_ZERO } from "./transform/box-cox";
export type { InverseStatus } from "./transform/box-cox";
export { yeoJohnson, yeoJohnsonInverse } from "./transform/yeo-johnson";
export { boxCoxLogLik, lambdaMle, MLE_MIN_LENGTH } from "./transform/lambda-mle";
export type { LambdaMleOptions, LambdaMleResult } from "./transform/lambda-mle";
export { lambdaGuerrero, guerreroObjective, guerreroWindowsUsable } from "./transform/guerrero";
export type { GuerreroOptions, GuerreroResult } from "./transform/guerrero";
export { readableLambda, READABLE_LAMBDAS } from "./transform/readable";
export { fitLambda } from "./transform/fit-lambda";
export type { FitLambdaOptions, LambdaChoice, LambdaMethod } from "./transform/fit-lambda";
export { DEFAULT_LAMBDA_BOUNDS } from "./transform/bounds";
export {
  makeTransform, transformForward, transformInverse, logJacobian, inverseSecondDerivative, exactMeanExists, poleProbability, describeTransform, TRANSFORMS,
} from "./transform/spec";
export type { TransformKind, TransformSpec, SpecInverse } from "./transform/spec";
export { autoShift, parseShift } from "./transform/shift";

export { screenSeries } from "./series/screen";
export type { RawCell, ScreenResult, SuggestedFix } from "./series/screen";

export { normalCdf, normalPdf, normalQuantile, normalSf } from "./distribution/normal";
export { chiSquareQuantile, chiSquareSf } from "./distribution/chisquare";
export {
  backtransformMean,
  backtransformMeanExact,
  backtransformMeanTaylor,
  backtransformMedian,
  backtransformQuantile,
  backtransformQuantileDetailed,
} from "./distribution/backtransform";
export { MEAN_METHODS } from "./distribution/backtransform";
export type { ExactMean, MeanMethod, QuantileValue } from "./distribution/backtransform";
export { forecastMean, parseMeanMethod, TAYLOR_NOTE_CORRECTION, TAYLOR_NOTE_POLE } from "./distribution/mean";
export type { MeanResult } from "./distribution/mean";
export { impliedLambda, meanFromInterval } from "./distribution/from-interval";
export type { RecoveredForecast } from "./distribution/from-interval";
export { cleanSeries, observedValues, countMissing, listRows, MAX_MISSING_SHARE, ZEROS_OPTION_ALL_FACES } from "./series/clean";
export type { CleanOptions, ZerosRule } from "./series/clean";
export { isHeaderRow } from "./series/header";
export type { CleanSeries } from "./series/clean";
export { requirePositiveSeries, isConstant } from "./series/positive";
export { createRandom } from "./_lib/random";
export type { Random } from "./_lib/random";
export { requireLevelPercent as checkLevelPercent, requireLambda as checkLambda } from "./_lib/check";

export { METHODS, SMOOTHING, parseMethod, isBenchmark } from "./models/methods";
export type { MethodName, SmoothingMethod, BenchmarkMethod } from "./models/methods";
export type { FittedModel, StepMoments } from "./models/types";
export { fitSmoothing, smoothingWithParams, smoothingAtParams, parameterCount, minimumLength, checkGapsFit, SMOOTH_LO, SMOOTH_HI, PHI_LO, PHI_HI } from "./models/ets";
export type { Smoothing, InitialStates } from "./models/ets";
export { fitBenchmark } from "./models/benchmarks";
export { fitAuto } from "./models/select";
export type { AutoChoice, Candidate } from "./models/select";
export { fitArima, arimaMinimumLength } from "./models/arima/fit";
export type { ArimaModel, ArimaParams } from "./models/arima/fit";
export { autoArima } from "./models/arima/auto";
export type { ArimaSearch } from "./models/arima/auto";
export { parseArimaMethod, isArimaMethod, formatArimaOrder, arimaTitle, ARIMA_LIMITS } from "./models/arima/order";
export type { ArimaOrder, ArimaSpec } from "./models/arima/order";
export { kpss, canovaHansen } from "./models/arima/unit-root";
export { stateSpaceMoments } from "./models/state-space";
export type { StateSpaceForm } from "./models/state-space";
export { fitForecast, checkHorizon, parseTransform } from "./models/fit";
export { chooseLambdaAuto, fitLambdaForModel, profileModelLambda, originalScaleFit, jacobianOf, aiccOf, transformSeries } from "./models/lambda-choice";
export type { LambdaAuto, LambdaCandidate, ModelLambda, ModelLambdaOptions, OriginalScaleFit } from "./models/lambda-choice";
export type { Forecaster, ForecastOptions, LambdaSpec } from "./models/fit";
export { fanTable, quantileTable, totalForecast, checkWindowStart, describeForecaster, parseLevels } from "./models/fan";
export type { FanRow, FanTable, Maybe, TotalForecast, DescriptionRow } from "./models/fan";

export { publishedTotal, parseDependence } from "./totals/published";
export type { DependenceSpec, PublishedMonth, PublishedTotal, PublishedTotalOptions, TotalRange } from "./totals/published";
export { fitLocalLevelWidening, localLevelCorrelation, IMPLIED_FIT_TOLERANCE } from "./totals/implied-dependence";
export type { LocalLevelFit } from "./totals/implied-dependence";
export { alignSeries, totalAcross, ACROSS_MIN_COMMON } from "./totals/across";
export type { AlignedColumns, AcrossSeries, AcrossTotal, TotalAcrossOptions } from "./totals/across";
export { smearingMean } from "./totals/smearing";
export type { SmearingMean } from "./totals/smearing";

export { hitSequence } from "./audit/hits";
export type { HitSequence } from "./audit/hits";
export { kupiec, transitions, christoffersenIndependence, independenceFromCounts, conditionalCoverage, binomialTail, trafficLight } from "./audit/coverage-tests";
export { overlapTests } from "./audit/overlap";
export type { StrandTests } from "./audit/overlap";
export { verdictOf, VERDICT_HEADLINES } from "./audit/verdict";
export type { Verdict, VerdictCode, VerdictInput } from "./audit/verdict";
export { auditLog, POOLED } from "./audit/audit-log";
export type { AuditLog, AuditLogInput, AuditRow, IntervalColumns } from "./audit/audit-log";
export { calibrationTable, clopperPearson } from "./audit/calibration";
export type { Calibration, CalibrationRow, CalibrationInterval, QuantileColumn } from "./audit/calibration";
export type { LrTest, Transitions, Zone } from "./audit/coverage-tests";
export { intervalScore, pinball, crpsNormal, crpsBacktransformed } from "./audit/scores";
export { auditCoverage } from "./audit/audit";
export type { CoverageAudit } from "./audit/audit";
export { backtest, backtestAsync, practicalMinimum, PRACTICAL_MINIMUM } from "./audit/backtest";
export type { Backtest, BacktestRow, BacktestOptions } from "./audit/backtest";
