/**
 * C3D reading and writing (the open biomechanics motion-capture format documented at c3d.org).
 */
export type {
  C3dAnalog,
  C3dAnalogChannel,
  C3dDataType,
  C3dEvent,
  C3dFile,
  C3dGroup,
  C3dHeader,
  C3dHeaderEvent,
  C3dParameter,
  C3dPoints,
  C3dPointTrajectory,
  C3dProcessor,
} from './c3dTypes';
export { C3D_PROCESSOR_BYTE } from './c3dTypes';
export { readC3d, readC3dEventGroup } from './readC3d';
export { c3dToRecording, c3dMetresPerUnit } from './c3dToRecording';
export {
  getC3dParameter,
  getC3dNumber,
  getC3dUint16,
  getC3dString,
  getC3dStringList,
  getC3dNumberList,
} from './c3dParameterValues';
export { vaxFloatToNumber, numberToVaxFloat } from './c3dNumbers';
export { writeC3d, type WriteC3dOptions } from './writeC3d';
export { C3dParameterSectionBuilder } from './c3dParameterSection';
