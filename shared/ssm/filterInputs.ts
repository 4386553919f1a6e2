/**
 * Argument checks shared by the filter entry points (internal to `shared/ssm/`).
 */
import { DimensionMismatchError } from '../errors';
import { validateModel, type ObservationPart } from './stateSpaceModel';

/**
 * Checks model, observations and sample times before filtering.
 * @returns the number of samples T
 * @throws RangeError for zero-length input, non-finite or non-increasing times, or infinite observations
 * @throws DimensionMismatchError when z or timesS do not match the model's m
 */
export function checkFilterInputs(model: ObservationPart, z: Float64Array, timesS: Float64Array): number {
  validateModel(model);
  if (!(z instanceof Float64Array)) throw new TypeError('z must be a Float64Array (T*m, NaN for missing)');
  if (!(timesS instanceof Float64Array)) throw new TypeError('timesS must be a Float64Array (T, strictly increasing)');
  const T = timesS.length;
  if (T === 0) throw new RangeError('kalmanFilter: zero-length input (timesS is empty); at least one sample is needed');
  if (z.length !== T * model.m) {
    throw new DimensionMismatchError(`z has ${z.length} entries, expected T*m = ${T}*${model.m} = ${T * model.m}`);
  }
  if (!Number.isFinite(timesS[0])) throw new RangeError(`timesS[0] is not finite (${timesS[0]})`);
  for (let k = 1; k < T; k++) {
    const dt = timesS[k] - timesS[k - 1];
    if (!(dt > 0) || !Number.isFinite(timesS[k])) {
      throw new RangeError(`timesS must be finite and strictly increasing: timesS[${k - 1}] = ${timesS[k - 1]}, timesS[${k}] = ${timesS[k]}`);
    }
  }
  for (let i = 0; i < z.length; i++) {
    const v = z[i];
    if (v === Infinity || v === -Infinity) {
      throw new RangeError(`z[${i}] (sample ${Math.floor(i / model.m)}, component ${i % model.m}) is infinite; use NaN for a missing value`);
    }
  }
  return T;
}
