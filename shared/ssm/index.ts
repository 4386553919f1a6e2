/**
 * Public API of Forecatch's state-space engine: the linear-Gaussian model description, Kalman filter and
 * RTS smoother (general dense code plus scalar per-axis kernels), dynamics hypotheses, noise estimation
 * (EM and direct likelihood), the extended filter/smoother for the drag hypothesis, and arrival /
 * time-to-contact prediction.
 */
export type { StateSpaceModel, ObservationPart, TimeInvariantModelSpec } from './stateSpaceModel';
export { validateModel, timeInvariantModel, localLevelModel } from './stateSpaceModel';
export type { FilterResult, KalmanFilterOptions } from './kalmanFilter';
export { kalmanFilter } from './kalmanFilter';
export type { SmoothResult, RtsSmoothOptions } from './rtsSmooth';
export { rtsSmooth } from './rtsSmooth';
export { whiteNoiseAccelerationQ, whiteJerkQ } from './processNoise';
export type { HypothesisKind, HypothesisSpec, AxisModelOptions } from './hypotheses';
export { STANDARD_GRAVITY_MPS2, makeAxisModel, axisStateLayout, parseUpAxis } from './hypotheses';
export type { ArrivalInput, ArrivalPrediction, ArrivalStatus, TimeToContactInput, TimeToContact } from './arrival';
export { predictArrival, timeToContact } from './arrival';
export type { AxisKinematics } from './axisKinematics';
export { axisKinematics } from './axisKinematics';
export type { AxisWorkspace } from './filterSmoothAxis';
export { createAxisWorkspace, filterSmoothAxis } from './filterSmoothAxis';
export type { NoiseModelBuilder, NoiseFitOptions, NoiseFit } from './estimateNoise';
export { fitNoiseEm, fitNoiseMle } from './estimateNoise';
export type { NonlinearStateSpaceModel } from './extendedKalmanFilter';
export { extendedKalmanFilter, extendedRtsSmooth } from './extendedKalmanFilter';
export { makeDragAxisModel } from './dragModel';
export type { DragArrivalInput } from './predictArrivalDrag';
export { predictArrivalDrag } from './predictArrivalDrag';
export type { AxisLogLik } from './axisLogLik';
export { createAxisLogLik } from './axisLogLik';
export { nelderMead2 } from './minimize';
