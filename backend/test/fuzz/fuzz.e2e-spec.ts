// Property-based fuzzing of every write route (POST/PUT/PATCH/DELETE, read from the app's own route
// metadata, so a new route is fuzzed without an entry here): generated bad requests, each sent as a
// role that may call the route, must answer below 500, within 2 s, and leave the row count of every
// table as it was. Every request carries at least one fault the API must refuse (an unknown field, a
// field of the wrong type, null where the column cannot take it, an id that is not decimal digits,
// JSON nested too deep, bytes that are not UTF-8, JSON cut short, a body over the size limit, a body
// that is not an object), and random noise besides (arbitrary JSON values, huge strings, bad query
// values). Seeded: KC_FUZZ_SEED=<n> replays a run; a failure prints the request that caused it.
import fc from 'fast-check';
import type { Role } from '@kilocycle/common/types';
import { countChanges, rowCounter } from '../support/row-counts.js';
import { createTestApp, signInDemo, type AsDemo, type DemoAccount, type TestApp } from '../support/test-app.js';
import { writeRoutes, type BodyField, type WriteRoute } from './routes.js';

const SEED = Number(process.env.KC_FUZZ_SEED ?? 13_2026);
const MIN_REQUESTS = 1000;
const ANSWER_WITHIN_MS = 2000;

const ACCOUNT: Record<Role, DemoAccount[]> = {
  admin: ['admin'],
  lead: ['lead'],
  technician: ['tech'],
  engineer: ['engineer'],
  client: ['northgate', 'saltmarsh'],
};

/** One generated request: what is sent, and the fault that makes it bad. */
type BadRequest = {
  account: DemoAccount | null;
  params: string[];
  query: Record<string, string>;
  contentType: string;
  body: Buffer;
  fault: string;
};

const HUGE = 'Ω'.repeat(60_000);
const BAD_IDS = ['0x10', '1e1', ' 16', '16.0', '-1', '+3', '99999999999', '2147483648', 'abc', '1;DROP', '%00', '١٢'];
const GOOD_LOOKING_IDS = ['1', '2', '3', '4', '5', '6'];
const BAD_QUERY = ['1e20', '-1', '0', '0x10', 'NaN', '', '1.5', 'null', '9'.repeat(40)];

/** Any JSON value, some of them awkward: nulls, huge strings, extreme numbers, deep-ish nests. */
const noise: fc.Arbitrary<unknown> = fc.oneof(
  { weight: 4, arbitrary: fc.jsonValue({ maxDepth: 3 }) },
  {
    weight: 2,
    arbitrary: fc.constantFrom<unknown>(
      null,
      '',
      ' ',
      '\u0000',
      -1,
      0,
      -0,
      1e308,
      -1e308,
      2 ** 53 + 1,
      2147483648,
      '0x10',
      '1e20',
      true,
      false,
      [],
      {},
      [null],
      { '': null },
    ),
  },
  { weight: 1, arbitrary: fc.constant(HUGE) },
  { weight: 2, arbitrary: fc.string({ unit: 'binary', maxLength: 40 }) },
);

/** A value no field of ours accepts: an object with a key no DTO has (scalars, arrays and nested DTOs all refuse it). */
const refusedValue = fc.string({ minLength: 1, maxLength: 8 }).map((key) => ({ [`zz${key}`]: [1, { x: null }] }));

const nested = (depth: number, kind: 'array' | 'object') =>
  kind === 'array' ? '['.repeat(depth) + ']'.repeat(depth) : '{"a":'.repeat(depth) + '0' + '}'.repeat(depth);

function fieldsArb(fields: BodyField[]): fc.Arbitrary<Record<string, unknown>> {
  if (fields.length === 0) return fc.constant({});
  return fc
    .subarray(fields)
    .chain((chosen) => fc.tuple(...chosen.map(() => noise)).map((values) => Object.fromEntries(chosen.map((f, i) => [f.name, values[i]]))));
}

const json = (value: unknown) => Buffer.from(JSON.stringify(value), 'utf8');

/** The body and its fault. A route without a body DTO takes any object, so only faults the body parser refuses are sure for it. */
function bodyArb(route: WriteRoute): fc.Arbitrary<{ body: Buffer; contentType: string; fault: string }> {
  const fields = route.body?.fields ?? [];
  const parserFaults = [
    fc.tuple(fc.integer({ min: 33, max: 4000 }), fc.constantFrom<'array' | 'object'>('array', 'object')).map(([depth, kind]) => ({
      body: Buffer.from(`{"x":${nested(depth, kind)}}`),
      contentType: 'application/json',
      fault: `JSON nested ${depth} deep`,
    })),
    fc.tuple(fieldsArb(fields), fc.constantFrom([0xc3, 0x28], [0xff], [0xed, 0xa0, 0x80], [0xe2, 0x82])).map(([value, bytes]) => {
      const text = JSON.stringify({ ...value, note: 'X' });
      const at = text.lastIndexOf('X');
      return {
        body: Buffer.concat([Buffer.from(text.slice(0, at)), Buffer.from(bytes), Buffer.from(text.slice(at + 1))]),
        contentType: 'application/json',
        fault: `invalid UTF-8 ${bytes.map((b) => b.toString(16)).join(' ')}`,
      };
    }),
    fc.tuple(fieldsArb(fields), fc.integer({ min: 1, max: 20 })).map(([value, cut]) => {
      const text = JSON.stringify({ ...value, end: true });
      return { body: Buffer.from(text.slice(0, Math.max(1, text.length - cut))), contentType: 'application/json', fault: 'JSON cut short' };
    }),
    fc.constant({ body: Buffer.from(`{"x":"${'a'.repeat(1_100_000)}"}`), contentType: 'application/json', fault: 'body over 1 MB' }),
  ];
  if (!route.body) return fc.oneof(...parserFaults);
  const nullable = fields.filter((f) => f.nullRefused);
  const dtoFaults = [
    fc.tuple(fieldsArb(fields), fc.string({ minLength: 1, maxLength: 12 }), noise).map(([value, key, extra]) => ({
      body: json({ ...value, [`zz_${key}`]: extra }),
      contentType: 'application/json',
      fault: `unknown field zz_${key}`,
    })),
    fc.tuple(fieldsArb(fields), fc.constantFrom(...fields), refusedValue).map(([value, field, bad]) => ({
      body: json({ ...value, [field.name]: bad }),
      contentType: 'application/json',
      fault: `${field.name} of the wrong type`,
    })),
    fc
      .tuple(
        fieldsArb(fields),
        fc.jsonValue({ maxDepth: 2 }).filter((v) => v === null || typeof v !== 'object' || Array.isArray(v)),
      )
      .map(([, top]) => ({
        body: json(Array.isArray(top) ? top : [top]),
        contentType: 'application/json',
        fault: 'a body that is an array, not an object',
      })),
    fc.tuple(fieldsArb(fields), fc.string({ minLength: 1, maxLength: 12 })).map(([value, key]) => ({
      body: Buffer.from(new URLSearchParams({ ...Object.fromEntries(Object.entries(value).map(([k, v]) => [k, formText(v)])), [`zz_${key}`]: 'x' }).toString()),
      contentType: 'application/x-www-form-urlencoded',
      fault: `a form with unknown field zz_${key}`,
    })),
  ];
  if (nullable.length > 0) {
    dtoFaults.push(
      fc.tuple(fieldsArb(fields), fc.constantFrom(...nullable)).map(([value, field]) => ({
        body: json({ ...value, [field.name]: null }),
        contentType: 'application/json',
        fault: `${field.name} null`,
      })),
    );
  }
  return fc.oneof(...dtoFaults, ...parserFaults);
}

function requestArb(route: WriteRoute): fc.Arbitrary<BadRequest> {
  const accounts = route.roles.flatMap((role) => (role === 'anonymous' ? [null] : ACCOUNT[role]));
  const param = fc.oneof(fc.constantFrom(...GOOD_LOOKING_IDS), fc.constantFrom(...BAD_IDS));
  const params = fc.tuple(...route.params.map(() => param));
  const query = fc.dictionary(fc.constantFrom('page', 'pageSize', 'mode', 'confirmed', 'importId', 'sort'), fc.constantFrom(...BAD_QUERY), { maxKeys: 2 });
  // Ids and query values are noise here: the body's fault alone must be refused whatever they are.
  return fc.tuple(fc.constantFrom(...accounts), params, query, bodyArb(route)).map(([account, ids, q, body]) => ({ account, params: ids, query: q, ...body }));
}

function describeRequest(route: WriteRoute, req: BadRequest, url: string): string {
  const text = req.body.toString('latin1');
  const excerpt = text.length > 300 ? `${text.slice(0, 300)}… (${req.body.length} bytes)` : text;
  return `${route.method} ${url} as ${req.account ?? 'anonymous'} [${req.contentType}] fault: ${req.fault}; body: ${excerpt}`;
}

describe('fuzzing every write route with bad requests (e2e, MariaDB)', () => {
  let t: TestApp;
  let as: AsDemo;
  let counts: () => Promise<Record<string, number>>;
  let routes: WriteRoute[];

  beforeAll(async () => {
    t = await createTestApp();
    as = await signInDemo(t.http);
    counts = await rowCounter(t.dataSource);
    routes = writeRoutes(t.app);
  });
  afterAll(() => t.close());

  it('finds the write routes of every module', () => {
    // Common practice, no published source: a lab system of this size has dozens of write routes; a
    // handful would mean the route discovery broke, not that the API shrank.
    expect(routes.length).toBeGreaterThanOrEqual(30);
    expect(routes.map((r) => `${r.method} ${r.path}`)).toEqual(
      expect.arrayContaining(['POST /api/auth/login', 'PATCH /api/users/:id', 'PATCH /api/settings', 'POST /api/comparisons/compute']),
    );
  });

  it(`at least ${MIN_REQUESTS} bad requests across them: no 5xx, each within 2 s, no row added or removed`, async () => {
    const perRoute = Math.ceil(MIN_REQUESTS / routes.length);
    let sent = 0;
    const failures: string[] = [];
    let before = await counts();
    for (const [index, route] of routes.entries()) {
      const seed = SEED + index;
      const details = await fc.check(
        fc.asyncProperty(requestArb(route), async (req) => {
          let n = 0;
          const url = route.path.replace(/:\w+/g, () => encodeURIComponent(req.params[n++]));
          const started = Date.now();
          let call = t.http[route.method.toLowerCase() as 'post'](url).query(req.query).set('Content-Type', req.contentType);
          if (req.account) call = call.set(as(req.account));
          const res = await call.serialize(((b: Buffer) => b) as unknown as (b: unknown) => string).send(req.body as unknown as string);
          const took = Date.now() - started;
          sent++;
          const after = await counts();
          const changed = countChanges(before, after);
          before = after;
          const what = describeRequest(route, req, url + (Object.keys(req.query).length ? `?${new URLSearchParams(req.query)}` : ''));
          if (res.status >= 500) throw new Error(`${res.status} ${JSON.stringify(res.body).slice(0, 300)} for ${what}`);
          if (res.status < 400) throw new Error(`${res.status} (accepted a bad request) for ${what}`);
          if (took > ANSWER_WITHIN_MS) throw new Error(`answered after ${took} ms for ${what}`);
          if (changed.length > 0) throw new Error(`rows changed (${changed.join(', ')}) for ${what}`);
        }),
        { seed, numRuns: perRoute, endOnFailure: true },
      );
      // The first failing request of the route, as sent; KC_FUZZ_SEED=<SEED> replays the whole run.
      if (details.failed)
        failures.push(`seed ${seed}: ${details.errorInstance instanceof Error ? details.errorInstance.message : String(details.errorInstance)}`);
    }
    expect(failures).toEqual([]);
    expect(sent).toBeGreaterThanOrEqual(MIN_REQUESTS);
  }, 120_000);
});

/** A value as a form field's text: objects (a list of lines, say, or one made without a prototype) as JSON. */
function formText(value: unknown): string {
  return typeof value === 'object' && value !== null ? JSON.stringify(value) : String(value);
}
