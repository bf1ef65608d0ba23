export { cohensKappa, entityAgreement, type EntityAgreement, type KappaResult } from "./agreement";
export { pairedBootstrap, type PairedBootstrapResult } from "./bootstrap";
export { computeConfusionMatrix, type ConfusionMatrix } from "./confusion";
export { computePrf, scoreEntities, tokenAccuracy, type EntityScores, type Prf } from "./entity-scores";
export { learningCurvePlan, type LearningCurveStep } from "./learning-curve";
export { expectedCalibrationError, type CalibrationBin, type CalibrationReport } from "./calibration";
