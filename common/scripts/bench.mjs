// Benchmark of the metrology core on 1,000,000 readings (run: npm run bench -w common).
// Prints the linear fit, the warm-up drift fit and the overlapping Allan deviation at all
// octaves, each in ms, then every deviation (ADEV, MDEV, HDEV, TDEV, TOTDEV) at all octaves
// plus decades (1-2-5) with its total against the 1.5 s target (issue 19), beside simple-statistics' linearRegression on the same data, and the
// total against the 1 s target, then the MAD outlier screen a stability analysis runs on the same 1,000,000 points and
// the stability table as the analysis asks for it (every deviation with its noise named, edf and 95 % interval).
// Not a test: figures vary with the machine and its load.
import { linearRegression } from 'simple-statistics';
import {
  decades,
  fitLine,
  fitWarmup,
  fractionalFrequency,
  hadamardDev,
  madOutliers,
  modifiedAdev,
  octaves,
  overlappingAdev,
  phaseFromFractionalFrequency,
  stabilityTable,
  timeDev,
  totalDev,
} from '../dist/math/index.js';

const COUNT = 1_000_000;
const TAU0 = 0.01; // s: 100 readings a second for 10 000 s
const NOMINAL = 7_000_000;

// Seeded data: a warm-up of τ = 900 s, −250 Hz, plus white noise (mulberry32 + Box–Muller).
let state = 20240601;
function uniform() {
  state = (state + 0x6d2b79f5) >>> 0;
  let t = state;
  t = Math.imul(t ^ (t >>> 15), t | 1);
  t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
  return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
}
function gaussian() {
  return Math.sqrt(-2 * Math.log(Math.max(uniform(), 1e-300))) * Math.cos(2 * Math.PI * uniform());
}
const t = new Float64Array(COUNT);
const f = new Float64Array(COUNT);
for (let i = 0; i < COUNT; i++) {
  t[i] = i * TAU0;
  f[i] = NOMINAL - 250 * Math.exp(-t[i] / 900) + 2 * gaussian();
}

function time(label, run) {
  const start = performance.now();
  const result = run();
  const ms = performance.now() - start;
  return { label, ms, result };
}

// One warm-up pass so the figures show steady-state code, not the JIT's first compile.
fitLine(t.subarray(0, 10_000), f.subarray(0, 10_000));
fitWarmup(t.subarray(0, 10_000), f.subarray(0, 10_000));
overlappingAdev(fractionalFrequency(f.subarray(0, 10_000), NOMINAL), TAU0);

const line = time('linear fit (fitLine)', () => fitLine(t, f));
const drift = time('drift fit (fitWarmup)', () => fitWarmup(t, f));
const adev = time('overlapping ADEV, all octaves (incl. fractional frequency)', () => overlappingAdev(fractionalFrequency(f, NOMINAL), TAU0));
const pairs = time('  (building [t, f] pairs for simple-statistics)', () => Array.from(t, (value, i) => [value, f[i]]));
const reference = time('simple-statistics linearRegression (reference)', () => linearRegression(pairs.result));

const pad = (text) => text.padEnd(62);
console.log(`Kilocycle metrology core, ${COUNT.toLocaleString('en-US')} readings at τ0 = ${TAU0} s (Node ${process.version})`);
for (const row of [line, drift, adev]) console.log(`${pad(row.label)}${row.ms.toFixed(1).padStart(9)} ms`);
console.log(`${pad(reference.label)}${reference.ms.toFixed(1).padStart(9)} ms`);
console.log(`${pad(pairs.label)}${pairs.ms.toFixed(1).padStart(9)} ms`);
const total = line.ms + drift.ms + adev.ms;
console.log(`${pad('total of the three')}${total.toFixed(1).padStart(9)} ms   target < 1000 ms: ${total < 1000 ? 'met' : 'NOT met'}`);
console.log('');
console.log(`fitLine slope ${line.result.slope.toExponential(6)} Hz/s vs simple-statistics ${reference.result.m.toExponential(6)} Hz/s`);
console.log(
  `fitWarmup τ = ${drift.result.tau.toFixed(2)} ± ${drift.result.seTau.toFixed(2)} s (true 900), A = ${drift.result.amplitude.toFixed(3)} Hz (true −250), residual SD ${drift.result.residualSd.toFixed(3)} Hz (true 2), LM on ${drift.result.fittedPoints} bins`,
);

// Every deviation at all octaves plus decades (issue 19), from the same readings; timed from the
// readings in Hz (fractional frequency and phase included), edf and χ² intervals included.
const factorsUpTo = (limit) => [...new Set([...octaves(limit), ...decades(limit)])].sort((a, b) => a - b);
const ySmall = fractionalFrequency(f.subarray(0, 10_000), NOMINAL);
const phaseSmall = phaseFromFractionalFrequency(ySmall, TAU0);
for (const fn of [hadamardDev, timeDev, totalDev]) fn(phaseSmall, TAU0);
modifiedAdev(ySmall, TAU0);
const conversion = time('  fractional frequency, then phase (x = Σ y·τ0)', () => {
  const y = fractionalFrequency(f, NOMINAL);
  return { y, x: phaseFromFractionalFrequency(y, TAU0) };
});
const { y, x } = conversion.result;
const N = x.length;
const deviations = [
  time('  ADEV (overlapping)', () => overlappingAdev(y, TAU0, { factors: factorsUpTo((N - 1) / 2) })),
  time('  MDEV', () => modifiedAdev(y, TAU0, { factors: factorsUpTo(N / 3) })),
  time('  HDEV (overlapping)', () => hadamardDev(x, TAU0, { factors: factorsUpTo((N - 1) / 3) })),
  time('  TDEV', () => timeDev(x, TAU0, { factors: factorsUpTo(N / 3) })),
  time('  TOTDEV', () => totalDev(x, TAU0, { factors: factorsUpTo((N - 1) / 2) })),
];
console.log('');
console.log('All deviations at octaves plus decades (1-2-5), with edf and χ² intervals:');
console.log(`${pad(conversion.label)}${conversion.ms.toFixed(1).padStart(9)} ms`);
for (const row of deviations) console.log(`${pad(`${row.label}, ${row.result.length} factors`)}${row.ms.toFixed(1).padStart(9)} ms`);
const deviationTotal = deviations.reduce((sum, row) => sum + row.ms, conversion.ms);
console.log(`${pad('total of all deviations')}${deviationTotal.toFixed(1).padStart(9)} ms   target < 1500 ms: ${deviationTotal < 1500 ? 'met' : 'NOT met'}`);
// The MAD screen a stability analysis runs beside the deviations (two medians of 1,000,000 values).
madOutliers(ySmall);
const mad = time('MAD outlier screen (madOutliers, k = 5)', () => madOutliers(y));
console.log(`${pad(mad.label)}${mad.ms.toFixed(1).padStart(9)} ms   ${mad.result.indices.length} flagged, MAD ${mad.result.mad.toExponential(3)}`);
const withMad = deviationTotal + mad.ms;
console.log(
  `${pad('total of all deviations and the MAD screen')}${withMad.toFixed(1).padStart(9)} ms   target < 1500 ms: ${withMad < 1500 ? 'met' : 'NOT met'}`,
);
// The table a stability run's analysis builds (GET /api/runs/:id/analysis): octaves, and decades as ?factors=decades asks.
stabilityTable(ySmall, TAU0, { confidence: 0.95 });
for (const spacing of ['octaves', 'decades']) {
  const table = time(`stability table (stabilityTable), ${spacing}, 95 %`, () => stabilityTable(y, TAU0, { spacing, confidence: 0.95 }));
  console.log(`${pad(`${table.label}, ${table.result.length} τ`)}${table.ms.toFixed(1).padStart(9)} ms`);
}
console.log('');
console.log(
  `ADEV: ${adev.result.length} octaves, τ = ${adev.result[0].tau} s … ${adev.result[adev.result.length - 1].tau} s; σ_y(${adev.result[0].tau} s) = ${adev.result[0].deviation.toExponential(3)}`,
);
