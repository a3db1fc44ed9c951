// Times the certificate PDF for a five-range job (eleven settings a range, three readings a setting,
// as found and as left), through the same renderer signing uses. No database: the results are computed
// in memory with the same budget code. Usage: npm run build -w common -w backend && node backend/scripts/bench-certificates.mjs [--out file.pdf]
import { writeFileSync } from 'node:fs';
import { analyseCalibration, decide, roundResultToUncertainty, toleranceHz } from '@kilocycle/common/math';
import { pointBudget, decisionRuleText, worstDecision } from '../dist/budgets/job-results.js';
import { renderCertificatePdf } from '../dist/certificates/certificate-pdf.js';

function gaussian(seed) {
  let state = seed >>> 0;
  const uniform = () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let x = state;
    x = Math.imul(x ^ (x >>> 15), x | 1);
    x ^= x + Math.imul(x ^ (x >>> 7), x | 61);
    return ((x ^ (x >>> 14)) >>> 0) / 4294967296;
  };
  return () => Math.sqrt(-2 * Math.log(Math.max(uniform(), 1e-12))) * Math.cos(2 * Math.PI * uniform());
}

const standard = {
  id: 1,
  name: 'Bench counter A',
  makeModel: 'Example reciprocal counter',
  serial: 'BC-1',
  certificateNumber: 'EXT-1',
  dueDate: '2027-12-01',
  timebaseAccuracyPpm: 0.05,
  resolutionHz: 0.001,
  calibrationUPpm: 0.02,
  calibrationK: 2,
};
const figures = { dialHalfDivision: 0.5, driftPpm: 2, driftHz: 0, counterResolutionHz: null, extraComponents: [] };
const tolerance = { kind: 'percent', percent: 0.5 };
const noise = gaussian(7);
const ranges = [];
for (let position = 1; position <= 5; position++) {
  const low = 500 * 2 ** (position - 1);
  const high = low * 1.5;
  const points = new Map();
  const fits = {};
  for (const [kind, scale] of [
    ['asFound', 1 - 0.004 * position],
    ['asLeft', 1 - 0.0002],
  ]) {
    const readings = [];
    for (let i = 0; i <= 10; i++) {
      const dial = low + ((high - low) * i) / 10;
      for (let k = 0; k < 3; k++) readings.push({ dial, frequency: dial * 1e3 * scale + 3 * noise() });
    }
    const analysis = analyseCalibration({ law: { kind: 'direct', unit: 'kHz' }, tolerance, readings });
    fits[kind] = { runId: position * 10 + (kind === 'asLeft' ? 1 : 0), fit: analysis.fit, tracking: analysis.tracking };
    for (const p of analysis.points) {
      const samples = readings.filter((r) => r.dial === p.dial).map((r) => r.frequency);
      const budget = pointBudget({ nominalHz: p.nominal, samples, standard, figures, slopeHzPerDialUnit: 1000, dialUnit: 'kHz' });
      const d = decide({ errorHz: p.errorHz, toleranceHz: p.toleranceHz, U: budget.U, rule: 'guarded' });
      const r = roundResultToUncertainty(p.errorHz, budget.U);
      const entry = points.get(p.dial) ?? { dial: p.dial, nominal: p.nominal, toleranceHz: toleranceHz(tolerance, p.nominal), asFound: null, asLeft: null };
      entry[kind] = {
        runId: fits[kind].runId,
        measured: p.measured,
        n: p.n,
        sd: p.sd,
        errorHz: p.errorHz,
        errorPpm: p.errorPpm,
        errorRounded: r.value,
        decimals: r.decimals,
        outlier: p.outlier,
        studentised: p.studentised,
        budget,
        decision: d.decision,
        tur: d.tur,
        turFlag: d.turFlag,
        guardBandHz: d.guardBandHz,
        acceptanceLimitHz: d.acceptanceLimitHz,
        problem: null,
      };
      points.set(p.dial, entry);
    }
  }
  const list = [...points.values()];
  ranges.push({
    rangeId: position,
    position,
    label: `Range ${position}`,
    dialUnit: 'kHz',
    dialMin: low,
    dialMax: high,
    freqMinHz: low * 1e3,
    freqMaxHz: high * 1e3,
    tolerance,
    asFoundRunId: fits.asFound.runId,
    asLeftRunId: fits.asLeft.runId,
    asFoundFit: fits.asFound,
    asLeftFit: fits.asLeft,
    points: list,
    decision: worstDecision(list.map((p) => p.asLeft.decision)),
    problems: [],
  });
}
const results = {
  jobId: 1,
  jobNumber: 'J2026-0001',
  jobStatus: 'in_review',
  procedure: { id: 1, name: 'Dial calibration', method: 'Direct comparison with a counter.', decisionRule: 'guarded' },
  decisionRule: 'guarded',
  decisionRuleText: decisionRuleText('guarded'),
  ranges,
  standards: [standard],
  decision: worstDecision(ranges.map((r) => r.decision)),
  flags: [],
};
const data = {
  number: 'QL-2026-0042',
  revision: 1,
  replaces: null,
  lab: { name: 'Benchmark Lab', address: '1 Test Street', place: 'At the laboratory' },
  customer: { name: 'Benchmark Customer', contact: 'someone@example.test' },
  instrument: { make: 'Example', model: 'Five-range generator', serial: 'X-1', assetTag: null, description: null },
  job: { number: 'J2026-0001', receivedDate: '2026-11-01', conditionReceived: 'Working', ambientTempC: 21, humidityPct: 45, supplyVoltages: [] },
  calibrationDates: { first: '2026-11-02', last: '2026-11-03' },
  issuedAt: new Date('2026-11-05T10:00:00Z'),
  results,
  deviations: [],
  signatory: {
    name: 'A. Signatory',
    role: 'Calibration lead (authorised signatory)',
    meaning: 'reviewed and approved for issue',
    signedAt: new Date('2026-11-05T10:00:00Z'),
  },
  verifyUrl: 'http://127.0.0.1:5180/verify/QL-2026-0042',
};

await renderCertificatePdf(data); // warm-up: fonts are read and parsed once
const times = [];
let pdf;
for (let i = 0; i < 10; i++) {
  const start = process.hrtime.bigint();
  pdf = await renderCertificatePdf(data);
  times.push(Number(process.hrtime.bigint() - start) / 1e6);
}
times.sort((a, b) => a - b);
const out = process.argv.indexOf('--out');
if (out > 0) writeFileSync(process.argv[out + 1], pdf);
console.log(`five ranges, ${ranges.reduce((n, r) => n + r.points.length, 0)} settings, ${pdf.length} bytes`);
console.log(`certificate PDF: median ${times[5].toFixed(1)} ms, max ${times[9].toFixed(1)} ms (target < 500 ms)`);
