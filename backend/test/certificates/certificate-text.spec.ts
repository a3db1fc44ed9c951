// The certificate's text helper: control characters never reach the PDF, single-line positions print one line,
// multi-line fields keep their paragraphs. The rendered PDF is read back with poppler's pdftotext (Debian
// poppler-utils), independent of the code that drew it.
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { JobResults, MeasuredPoint } from '@kilocycle/common/types';
import { renderCertificatePdf, type CertificatePdfData } from '../../src/certificates/certificate-pdf.js';
import { printableCertificateData } from '../../src/certificates/certificate-text.js';

const point = (measured: number, nominal: number): MeasuredPoint => ({
  runId: 7,
  measured,
  n: 3,
  sd: 0.4,
  errorHz: measured - nominal,
  errorPpm: ((measured - nominal) / nominal) * 1e6,
  errorRounded: measured - nominal,
  decimals: 1,
  outlier: false,
  studentised: null,
  budget: null,
  decision: 'pass',
  tur: 10,
  turFlag: false,
  guardBandHz: 0,
  acceptanceLimitHz: 100,
  problem: null,
});

// Values as they might sit in rows stored before single-line fields were enforced.
function hostile(): CertificatePdfData {
  const results = {
    jobId: 1,
    jobNumber: 'J-2025-0001',
    jobStatus: 'approved',
    procedure: { id: 1, name: 'Frequency\r\nFAKE PROCEDURE', method: 'Compare with the counter.\r\nTwo readings per setting.', decisionRule: 'simple' },
    decisionRule: 'simple',
    decisionRuleText: 'Simple acceptance.',
    ranges: [
      {
        rangeId: 1,
        position: 1,
        label: 'Band A\r\nBand Z',
        dialUnit: 'kHz',
        dialMin: 1000,
        dialMax: 2000,
        freqMinHz: 1e6,
        freqMaxHz: 2e6,
        tolerance: { kind: 'percent', percent: 0.5 },
        asFoundRunId: 7,
        asLeftRunId: null,
        asFoundFit: null,
        asLeftFit: null,
        points: [
          { dial: 1000, nominal: 1e6, toleranceHz: 5000, asFound: point(1_000_120, 1e6), asLeft: null },
          { dial: 2000, nominal: 2e6, toleranceHz: 10000, asFound: point(2_000_310, 2e6), asLeft: null },
        ],
        decision: 'pass',
        problems: [],
      },
    ],
    standards: [
      {
        id: 1,
        name: 'Counter\tC1',
        makeModel: 'Test counter',
        serial: 'CT-1\nFORGED',
        certificateNumber: 'C-1',
        dueDate: '2099-01-01',
        timebaseAccuracyPpm: 0.1,
        resolutionHz: 0.1,
        calibrationUPpm: 0.01,
        calibrationK: 2,
      },
    ],
    decision: 'pass',
    outcomes: { asFound: null, asLeft: null, asFoundFinalRanges: [], summary: 'As found: within tolerance.' },
    flags: [],
  } as unknown as JobResults;
  return {
    number: 'QL-25-0001',
    revision: 1,
    replaces: null,
    lab: { name: 'Quarry Lane\u0007 Lab', address: '1 Quarry Lane\r\nTestford', place: 'At the laboratory' },
    customer: { name: 'Saltmarsh\r\nRestoration Works', contact: 'shop@saltmarsh.test' },
    instrument: {
      make: 'Test\u2028Works',
      model: 'TG-1\tmk II',
      serial: 'SN 1234\r\nCalibration: PASS',
      assetTag: 'AT-9\u001b[2J',
      description: 'Two-band signal generator.\nDial cord replaced 1998.',
    },
    job: {
      number: 'J-2025-0001',
      receivedDate: '2025-03-01',
      conditionReceived: 'Case cracked.\r\n\r\n\r\n\r\n\r\nKnob missing.\u0000',
      ambientTempC: 21.5,
      humidityPct: 40,
      supplyVoltages: [],
    },
    calibrationDates: { first: '2025-03-02', last: '2025-03-02' },
    issuedAt: new Date('2025-03-03T10:00:00Z'),
    results,
    deviations: ['Warm-up shortened\u0085to 20 min.'],
    signatory: { name: 'Lee\nLead', role: 'Calibration lead', meaning: 'Approved\r\nand also something else', signedAt: new Date('2025-03-03T10:00:00Z') },
    verifyUrl: 'http://127.0.0.1:5180/verify/QL-25-0001',
  };
}

describe('printableCertificateData()', () => {
  const safe = printableCertificateData(hostile());

  test('single-line positions print one line', () => {
    expect(safe.instrument).toMatchObject({ make: 'Test Works', model: 'TG-1 mk II', serial: 'SN 1234 Calibration: PASS', assetTag: 'AT-9[2J' });
    expect(safe.customer.name).toBe('Saltmarsh Restoration Works');
    expect(safe.lab.name).toBe('Quarry Lane Lab');
    expect(safe.signatory).toMatchObject({ name: 'Lee Lead', meaning: 'Approved and also something else' });
    expect(safe.results.ranges[0]!.label).toBe('Band A Band Z');
    expect(safe.results.procedure.name).toBe('Frequency FAKE PROCEDURE');
    expect(safe.results.standards[0]).toMatchObject({ name: 'Counter C1', serial: 'CT-1 FORGED', timebaseAccuracyPpm: 0.1 });
  });

  test('multi-line fields keep their line breaks, lose other control characters and runs of empty lines', () => {
    expect(safe.instrument.description).toBe('Two-band signal generator.\nDial cord replaced 1998.');
    expect(safe.lab.address).toBe('1 Quarry Lane\nTestford');
    expect(safe.job.conditionReceived).toBe('Case cracked.\n\nKnob missing.');
    expect(safe.results.procedure.method).toBe('Compare with the counter.\nTwo readings per setting.');
    expect(safe.deviations).toEqual(['Warm-up shortened\nto 20 min.']);
  });

  test('numbers and dates pass through unchanged', () => {
    expect(safe.issuedAt).toBeInstanceOf(Date);
    expect(safe.issuedAt.getTime()).toBe(Date.parse('2025-03-03T10:00:00Z'));
    expect(safe.results.ranges[0]!.points[1]!.asFound!.measured).toBe(2_000_310);
    expect(safe.job.ambientTempC).toBe(21.5);
  });

  test('nothing in the result holds a control character other than LF', () => {
    const texts: string[] = [];
    const walk = (v: unknown): void => {
      if (typeof v === 'string') texts.push(v);
      else if (Array.isArray(v)) v.forEach(walk);
      else if (v && typeof v === 'object' && !(v instanceof Date)) Object.values(v).forEach(walk);
    };
    walk(safe);
    expect(texts.filter((s) => /[\u0000-\u0009\u000b-\u001f\u007f-\u009f\u2028\u2029]/.test(s))).toEqual([]);
  });
});

describe('renderCertificatePdf() with hostile text', () => {
  test('the serial prints on its row and no injected line stands alone (read back with pdftotext)', async () => {
    const pdf = await renderCertificatePdf(hostile());
    const dir = mkdtempSync(join(tmpdir(), 'kc-cert-text-'));
    try {
      const file = join(dir, 'certificate.pdf');
      writeFileSync(file, pdf);
      const lines = execFileSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' })
        .split('\n')
        .map((l) => l.trim());
      expect(lines.find((l) => l.startsWith('Serial number'))).toMatch(/^Serial number\s+SN 1234 Calibration: PASS$/);
      expect(lines.filter((l) => l.startsWith('Calibration: PASS'))).toEqual([]);
      expect(lines.find((l) => l.startsWith('Make and model'))).toMatch(/^Make and model\s+Test Works TG-1 mk II$/);
      expect(lines.find((l) => l.startsWith('Customer') && !l.startsWith('Customer contact'))).toMatch(/^Customer\s+Saltmarsh Restoration Works$/);
      expect(lines.filter((l) => l === 'Restoration Works' || l === 'FORGED' || l === 'Band Z')).toEqual([]);
      // The condition as received keeps its two paragraphs.
      const condition = lines.findIndex((l) => l.startsWith('Condition as received'));
      expect(lines[condition]).toMatch(/Case cracked\.$/);
      expect(lines.slice(condition + 1, condition + 4).filter((l) => l === 'Knob missing.')).toHaveLength(1);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
