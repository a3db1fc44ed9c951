export { FREQUENCY_UNIT_HZ, unitMultiplier, type FrequencyUnit } from './frequency-unit.js';
export { formatFrequency } from './format-frequency.js';
export { parseFrequency } from './parse-frequency.js';
export { parseNumber } from './parse-number.js';
export { UnitParseError } from './unit-parse-error.js';
export { MetrologyError, type MetrologyErrorCode } from '../math/metrology-error.js';
export {
  SPAN_MARGIN,
  checkFrequencySpan,
  isWithinSpan,
  outsideSpan,
  probableFrequency,
  spanLimits,
  type OutsideSpan,
  type SpanLimits,
} from './frequency-span.js';
export { parseTimeInterval } from './parse-time-interval.js';
