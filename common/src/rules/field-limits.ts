/**
 * Field limits shared by the server's DTOs (class-validator decorators) and the browser's form schemas
 * (zod), so a form refuses exactly what the server would refuse. Lengths count characters (JavaScript
 * string length), as `@MaxLength` and zod's `.max()` both do; numbers are inclusive bounds.
 * Common practice, no published source: the values were chosen for the lab's own records.
 */
export const FIELD_LIMITS = {
  /** Long free text: notes, descriptions, conditions. */
  notes: { max: 5000 },
  organization: { name: { max: 200 } },
  user: { email: { max: 254 }, name: { max: 200 }, password: { max: 200 } },
  bench: { name: { max: 120 }, location: { max: 200 } },
  instrument: { text: { max: 120 }, recallIntervalMonths: { min: 1, max: 120 } },
  range: { label: { max: 60 }, frequencyHz: { min: 1e-3, max: 1e11 }, multiplier: { max: 64 } },
  standard: {
    name: { max: 120 },
    makeModel: { max: 160 },
    text: { max: 120 },
    timebaseAccuracyPpm: { min: 0, max: 1000 },
    resolutionHz: { min: 1e-12, max: 1e6 },
    calibrationUPpm: { min: 0, max: 1000 },
    calibrationK: { min: 1, max: 10 },
  },
  job: { ambientTempC: { min: -40, max: 80 }, humidityPct: { min: 0, max: 100 }, statusComment: { min: 3, max: 2000 } },
  run: { overrideReason: { min: 10, max: 1000 }, correctionReason: { min: 3, max: 1000 }, supplyVoltage: { min: 0, max: 100000 } },
  attachment: { caption: { max: 500 } },
  reading: { excludeReason: { min: 3, max: 500 } },
  review: { submitComment: { max: 2000 }, returnComment: { min: 3, max: 4000 }, password: { max: 200 } },
  certificate: { reason: { min: 3, max: 2000 } },
  comparison: { title: { max: 200 }, label: { max: 120 } },
  procedure: { name: { max: 120 }, method: { max: 4000 }, dialHalfDivisionPercentOfSpan: { min: 0, max: 50 } },
} as const;
