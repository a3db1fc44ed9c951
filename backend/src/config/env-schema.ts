import { plainToInstance, Transform } from 'class-transformer';
import {
  isEmail,
  isFQDN,
  isIP,
  IsBoolean,
  IsIn,
  IsInt,
  IsNumber,
  IsOptional,
  IsString,
  IsUrl,
  Matches,
  Max,
  MaxLength,
  Min,
  MinLength,
  ValidateBy,
  validateSync,
  type ValidationOptions,
} from 'class-validator';

/**
 * Every KC_* setting the app reads, with its own range: the one schema behind loadConfig() and the
 * Nest ConfigModule's `validate`. Values arrive as text; switches accept 1/true/yes/on and
 * 0/false/no/off; an empty value counts as unset (the default applies).
 */

const ON = new Set(['1', 'true', 'yes', 'on']);
const OFF = new Set(['0', 'false', 'no', 'off']);

/** A switch as typed in a shell: true, false, or the text itself (which then fails @IsBoolean). */
const toSwitch = () =>
  Transform(({ value }: { value: unknown }) => {
    if (typeof value !== 'string') return value;
    const word = value.trim().toLowerCase();
    return ON.has(word) ? true : OFF.has(word) ? false : value;
  });
/** A whole number written in decimal digits (so `0x10` and `1e3` stay text and are refused). */
const toInteger = () => Transform(({ value }: { value: unknown }) => (typeof value === 'string' && /^\s*-?\d{1,16}\s*$/.test(value) ? Number(value) : value));
/** A decimal number (sizes in megabytes may be fractions). */
const toDecimal = () =>
  Transform(({ value }: { value: unknown }) => (typeof value === 'string' && /^\s*\d{1,9}(\.\d{1,9})?\s*$/.test(value) ? Number(value) : value));
const toList = () =>
  Transform(({ value }: { value: unknown }) =>
    typeof value === 'string'
      ? value
          .split(',')
          .map((part) => part.trim())
          .filter((part) => part !== '')
      : value,
  );

const SWITCH = '1, true, yes or on to turn it on; 0, false, no or off to turn it off';
const HOST = 'a host name or an IP address';

function between(min: number, max: number, what: string) {
  const message = `${what} from ${min} to ${max}`;
  return [Min(min, { message }), Max(max, { message })];
}
function integer(min: number, max: number, what = 'a whole number'): PropertyDecorator[] {
  return [toInteger(), IsInt({ message: `${what} from ${min} to ${max}` }), ...between(min, max, what)];
}
function apply(...decorators: PropertyDecorator[]): PropertyDecorator {
  return (target, key) => decorators.forEach((d) => d(target, key));
}
const Port = () => apply(IsOptional(), ...integer(1, 65535));
const Switch = () => apply(IsOptional(), toSwitch(), IsBoolean({ message: SWITCH }));
const Megabytes = (max: number) =>
  apply(
    IsOptional(),
    toDecimal(),
    IsNumber({}, { message: `a number of megabytes above 0, at most ${max}` }),
    Min(1 / 1024, { message: `a number of megabytes above 0, at most ${max}` }),
    Max(max, { message: `a number of megabytes above 0, at most ${max}` }),
  );

function isHost(value: unknown): boolean {
  return typeof value === 'string' && (isIP(value) || isFQDN(value, { require_tld: false, allow_underscores: true }));
}
const IsHost = (options?: ValidationOptions) => ValidateBy({ name: 'isHost', validator: { validate: isHost } }, { message: HOST, ...options });

/** An address (`10.0.0.1`, `::1`) or a block (`10.0.0.0/8`, `fd00::/8`). */
export function isAddressOrCidr(value: unknown): boolean {
  if (typeof value !== 'string') return false;
  const [address, prefix, extra] = value.split('/');
  if (extra !== undefined || !address) return false;
  const version = isIP(address) ? (address.includes(':') ? 6 : 4) : 0;
  if (version === 0) return false;
  if (prefix === undefined) return true;
  return /^\d{1,3}$/.test(prefix) && Number(prefix) <= (version === 4 ? 32 : 128);
}

/** Express's names for address ranges ('trust proxy'). */
const PROXY_NAMES = ['loopback', 'linklocal', 'uniquelocal'];
const isProxy = (value: unknown) => isAddressOrCidr(value) || PROXY_NAMES.includes(value as string);

/** A currency code the runtime's ISO 4217 data knows (so minor units mean the same everywhere). */
function isCurrency(value: unknown): boolean {
  if (typeof value !== 'string' || !/^[A-Z]{3}$/.test(value)) return false;
  return (Intl.supportedValuesOf('currency') as string[]).includes(value);
}

/** `Name <address>` or a bare address. */
function isSender(value: unknown): boolean {
  if (typeof value !== 'string') return false;
  const match = /^[^<>]*<([^<>]+)>\s*$/.exec(value);
  return isEmail((match ? match[1] : value).trim(), { require_tld: false });
}

export class EnvironmentVariables {
  @IsOptional() @IsIn(['demo', 'production'], { message: 'demo or production' }) KC_MODE?: 'demo' | 'production';
  @IsOptional() @IsHost() KC_HOST?: string;
  @Port() KC_PORT?: number;
  @IsOptional()
  @IsUrl({ require_protocol: true, protocols: ['http', 'https'], require_tld: false }, { message: 'an http:// or https:// address' })
  KC_PUBLIC_URL?: string;
  @IsOptional() @IsString() @MinLength(1) KC_VAR_DIR?: string;
  @IsOptional() @IsString() @MinLength(1) KC_FRONTEND_DIST?: string;

  @IsOptional() @IsHost() KC_DB_HOST?: string;
  @Port() KC_DB_PORT?: number;
  @IsOptional() @Matches(/^[A-Za-z0-9_]{1,64}$/, { message: 'a database name: 1 to 64 letters, digits or _' }) KC_DB_NAME?: string;
  @IsOptional() @Matches(/^[^\s'"`\\]{1,80}$/, { message: 'a database user name: 1 to 80 characters, no spaces or quotes' }) KC_DB_USER?: string;
  @IsOptional() @IsString() KC_DB_PASSWORD?: string;
  /** A MariaDB replica of the primary for reads (same user, password and database); unset: every query goes to the primary. */
  @IsOptional() @IsHost() KC_DB_REPLICA_HOST?: string;
  @Port() KC_DB_REPLICA_PORT?: number;
  /** This node's name in a cluster (logs, health details); bin/kilocycle cluster sets node-1, node-2 … */
  @IsOptional() @Matches(/^[A-Za-z0-9_-]{1,40}$/, { message: 'a node name: 1 to 40 letters, digits, - or _' }) KC_NODE_NAME?: string;

  @IsOptional() @IsString() @MinLength(1) KC_JWT_SECRET?: string;
  @IsOptional() @IsString() @MinLength(1) KC_JWT_SECRET_FILE?: string;
  @IsOptional() @IsString() @MinLength(1) KC_SIGNING_KEY_FILE?: string;
  @IsOptional()
  @IsUrl(
    { require_protocol: true, protocols: ['redis', 'rediss'], require_tld: false },
    { message: 'a redis:// or rediss:// address, like redis://127.0.0.1:6379' },
  )
  KC_REDIS_URL?: string;
  @IsOptional() @apply(...integer(60, 2_592_000, 'a number of seconds')) KC_JWT_TTL?: number;
  @IsOptional()
  @ValidateBy(
    { name: 'isAdminEmail', validator: { validate: (v: unknown) => typeof v === 'string' && isEmail(v, { require_tld: false }) } },
    { message: 'an e-mail address' },
  )
  KC_ADMIN_EMAIL?: string;
  @IsOptional()
  @IsString()
  @MinLength(12, { message: 'a password of 12 characters or more' })
  @MaxLength(72, { message: 'a password of at most 72 characters' })
  KC_ADMIN_PASSWORD?: string;

  @IsOptional() @IsHost() KC_SMTP_HOST?: string;
  @IsOptional() @apply(...integer(0, 65535, 'a port number (0 lets the mail catcher pick a free one)')) KC_SMTP_PORT?: number;
  @Switch() KC_SMTP_SECURE?: boolean;
  @IsOptional() @IsString() @MaxLength(254) KC_SMTP_USER?: string;
  @IsOptional() @IsString() KC_SMTP_PASSWORD?: string;
  @IsOptional() @ValidateBy({ name: 'isSender', validator: { validate: isSender } }, { message: 'an e-mail address, or Name <address>' }) KC_SMTP_FROM?: string;

  @IsOptional() @Matches(/^[A-Z][A-Z0-9]{0,7}$/, { message: '1 to 8 capital letters or digits, starting with a letter' }) KC_CERT_PREFIX?: string;
  @IsOptional() @IsString() @MaxLength(200, { message: 'a name of at most 200 characters' }) KC_LAB_NAME?: string;
  @IsOptional() @IsString() @MaxLength(500, { message: 'an address of at most 500 characters' }) KC_LAB_ADDRESS?: string;

  /** The lab's one currency (ISO 4217): every price, quote, invoice and payment is in its minor units. */
  @IsOptional()
  @ValidateBy({ name: 'isCurrency', validator: { validate: isCurrency } }, { message: 'an ISO 4217 currency code such as EUR' })
  KC_CURRENCY?: string;
  /** The local payment service fake's port (started only without KC_STRIPE_SECRET_KEY); 0 lets it pick a free one. */
  @IsOptional() @apply(...integer(0, 65535, 'a port number (0 lets the payment fake pick a free one)')) KC_PAYMENT_FAKE_PORT?: number;
  /** The real payment service: its secret API key and its webhook signing secret (both or neither). */
  @IsOptional() @Matches(/^(sk|rk)_(test|live)_[A-Za-z0-9]{8,}$/, { message: 'a secret key such as sk_live_…' }) KC_STRIPE_SECRET_KEY?: string;
  @IsOptional() @Matches(/^whsec_[A-Za-z0-9+/=]{8,}$/, { message: 'a webhook signing secret such as whsec_…' }) KC_STRIPE_WEBHOOK_SECRET?: string;

  @IsOptional() @apply(...integer(0, 86_400_000, 'a delay in milliseconds')) KC_RECALL_DELAY_MS?: number;
  @Switch() KC_RECALL_DISABLED?: boolean;

  @Megabytes(10_240) KC_IMPORT_MAX_MB?: number;
  @Megabytes(1_024) KC_ATTACHMENT_MAX_MB?: number;

  @IsOptional()
  @toList()
  @ValidateBy(
    { name: 'isProxyList', validator: { validate: (v: unknown) => Array.isArray(v) && v.every(isProxy) } },
    {
      message: ({ value }) =>
        `list IP addresses, CIDR blocks (10.0.0.0/8) or the names ${PROXY_NAMES.join(', ')}, separated by commas; not ` +
        (Array.isArray(value)
          ? value
              .filter((item) => !isProxy(item))
              .map((item) => `(got ${JSON.stringify(item)})`)
              .join(', ')
          : `(got ${JSON.stringify(value)})`),
    },
  )
  KC_TRUSTED_PROXIES?: string[];

  /** Read by bin/kilocycle test browser, not by the app; checked all the same. */
  @Port() KC_E2E_PORT?: number;
}

/** KC_* names that belong to the tooling (test runner, benchmarks, browser tests), not to the app. */
export const TOOLING_KEYS: readonly string[] = [
  'KC_BENCH_CLUSTER_PORT',
  'KC_BENCH_CLUSTER_READINGS',
  'KC_BENCH_DB',
  'KC_BENCH_KEEP',
  'KC_BENCH_ROUNDS',
  'KC_BENCH_SERVER_FLAGS',
  'KC_BENCH_SKIP_LARGE',
  'KC_CHROMIUM',
  'KC_CLUSTER_TEST_PORT',
  'KC_DB_BUFFER_POOL',
  'KC_DB_ROOT_SOCKET',
  'KC_E2E_SCREENSHOTS',
  'KC_E2E_URL',
  'KC_REDIS_PORT',
  'KC_SCALE_READINGS',
  'KC_SCALE_REUSE',
  'KC_SUITES',
];

/** A constraint's message as what the key must do: "be a whole number…", "list …". */
function mustPhrase(message: string): string {
  return /^(be|list|name) /.test(message) ? message : `be ${message}`;
}

/** One bad setting: its name, the value as given, and what it must do ("be …", "list …"). */
export type ConfigProblem = { key: string; value: string; must: string };

export type EnvironmentCheck = { values: EnvironmentVariables; problems: ConfigProblem[]; warnings: string[] };

const SHARED = 'every node of a cluster must read the same file, and a node never makes its own';

const SECRET_KEYS = new Set(['KC_DB_PASSWORD', 'KC_JWT_SECRET', 'KC_ADMIN_PASSWORD', 'KC_SMTP_PASSWORD', 'KC_STRIPE_SECRET_KEY', 'KC_STRIPE_WEBHOOK_SECRET']);

/** Checks every KC_* value at once; pure (no I/O), so the CLI, seeds and tests use it as main does. */
export function checkEnvironment(env: Record<string, unknown>): EnvironmentCheck {
  const raw: Record<string, string> = {};
  const warnings: string[] = [];
  const known = new Set(Object.keys(new EnvironmentVariables()).concat(KNOWN_KEYS));
  for (const [key, value] of Object.entries(env)) {
    if (!key.startsWith('KC_') || typeof value !== 'string' || value === '') continue;
    if (known.has(key)) {
      if (!TOOLING_KEYS.includes(key)) raw[key] = value;
    } else {
      warnings.push(`${key} is not a Kilocycle setting and is ignored (a misspelling?)`);
    }
  }
  const values = plainToInstance(EnvironmentVariables, raw);
  const problems: ConfigProblem[] = validateSync(values, { forbidUnknownValues: false }).map((error) => ({
    key: error.property,
    value: SECRET_KEYS.has(error.property) ? '(hidden)' : (raw[error.property] ?? ''),
    must: mustPhrase(Object.values(error.constraints ?? {})[0] ?? 'a valid value'),
  }));
  const has = (key: string) => problems.some((p) => p.key === key);
  if (values.KC_MODE === 'production' && !values.KC_ADMIN_PASSWORD && !has('KC_ADMIN_PASSWORD')) {
    problems.push({ key: 'KC_ADMIN_PASSWORD', value: '', must: 'be set in production mode (12 characters or more)' });
  }
  // A demo may use any secret; production signs real sessions, so a guessable one is refused.
  if (values.KC_MODE === 'production' && values.KC_JWT_SECRET !== undefined && values.KC_JWT_SECRET.length < 32 && !has('KC_JWT_SECRET')) {
    problems.push({
      key: 'KC_JWT_SECRET',
      value: '(hidden)',
      must: 'be 32 characters or more in production mode (e.g. openssl rand -hex 32), or unset to use var/jwt-secret',
    });
  }
  // Several nodes: each must hold the same session secret and certificate key, and none may make its own.
  if (values.KC_REDIS_URL !== undefined && !has('KC_REDIS_URL')) {
    if (values.KC_JWT_SECRET === undefined && values.KC_JWT_SECRET_FILE === undefined) {
      problems.push({ key: 'KC_JWT_SECRET_FILE', value: '', must: `be set (or KC_JWT_SECRET) when KC_REDIS_URL is: ${SHARED}` });
    }
    if (values.KC_SIGNING_KEY_FILE === undefined) {
      problems.push({ key: 'KC_SIGNING_KEY_FILE', value: '', must: `be set when KC_REDIS_URL is: ${SHARED}` });
    }
  }
  // The real payment service needs both its key and the secret its webhooks are signed with; production never
  // takes money through the local fake.
  const stripeKey = values.KC_STRIPE_SECRET_KEY !== undefined || has('KC_STRIPE_SECRET_KEY');
  const stripeSecret = values.KC_STRIPE_WEBHOOK_SECRET !== undefined || has('KC_STRIPE_WEBHOOK_SECRET');
  if (stripeKey && !stripeSecret) problems.push({ key: 'KC_STRIPE_WEBHOOK_SECRET', value: '', must: 'be set when KC_STRIPE_SECRET_KEY is (whsec_…)' });
  if (stripeSecret && !stripeKey) problems.push({ key: 'KC_STRIPE_SECRET_KEY', value: '', must: 'be set when KC_STRIPE_WEBHOOK_SECRET is (sk_…)' });
  if (values.KC_MODE === 'production' && !stripeKey && !stripeSecret) {
    problems.push({
      key: 'KC_STRIPE_SECRET_KEY',
      value: '',
      must: 'be set in production mode with KC_STRIPE_WEBHOOK_SECRET (the local payment fake takes no real money)',
    });
  }
  // A replica that is the primary itself would take reads "off" the primary and add nothing.
  if (values.KC_DB_REPLICA_HOST !== undefined && !has('KC_DB_REPLICA_HOST') && !has('KC_DB_REPLICA_PORT') && !has('KC_DB_HOST') && !has('KC_DB_PORT')) {
    const sameHost = values.KC_DB_REPLICA_HOST === (values.KC_DB_HOST ?? '127.0.0.1');
    if (sameHost && (values.KC_DB_REPLICA_PORT ?? 3318) === (values.KC_DB_PORT ?? 3317)) {
      problems.push({
        key: 'KC_DB_REPLICA_HOST',
        value: `${values.KC_DB_REPLICA_HOST}:${values.KC_DB_REPLICA_PORT ?? 3318}`,
        must: "name a replica, not the primary itself (KC_DB_HOST and KC_DB_PORT): give the replica's own host or KC_DB_REPLICA_PORT",
      });
    }
  }
  problems.sort((a, b) => a.key.localeCompare(b.key));
  return { values, problems, warnings };
}

/** The names the schema declares (class fields without initialisers are not own keys, so list them). */
const KNOWN_KEYS: readonly string[] = [
  'KC_MODE',
  'KC_HOST',
  'KC_PORT',
  'KC_PUBLIC_URL',
  'KC_VAR_DIR',
  'KC_FRONTEND_DIST',
  'KC_DB_HOST',
  'KC_DB_PORT',
  'KC_DB_NAME',
  'KC_DB_USER',
  'KC_DB_PASSWORD',
  'KC_DB_REPLICA_HOST',
  'KC_DB_REPLICA_PORT',
  'KC_NODE_NAME',
  'KC_JWT_SECRET',
  'KC_JWT_SECRET_FILE',
  'KC_SIGNING_KEY_FILE',
  'KC_REDIS_URL',
  'KC_JWT_TTL',
  'KC_ADMIN_EMAIL',
  'KC_ADMIN_PASSWORD',
  'KC_SMTP_HOST',
  'KC_SMTP_PORT',
  'KC_SMTP_SECURE',
  'KC_SMTP_USER',
  'KC_SMTP_PASSWORD',
  'KC_SMTP_FROM',
  'KC_CERT_PREFIX',
  'KC_LAB_NAME',
  'KC_LAB_ADDRESS',
  'KC_CURRENCY',
  'KC_PAYMENT_FAKE_PORT',
  'KC_STRIPE_SECRET_KEY',
  'KC_STRIPE_WEBHOOK_SECRET',
  'KC_RECALL_DELAY_MS',
  'KC_RECALL_DISABLED',
  'KC_IMPORT_MAX_MB',
  'KC_ATTACHMENT_MAX_MB',
  'KC_TRUSTED_PROXIES',
  'KC_E2E_PORT',
  ...TOOLING_KEYS,
];

/** A start refused for bad settings: the message lists each key, its value and what it must be. */
export class ConfigError extends Error {
  constructor(readonly problems: ConfigProblem[]) {
    super(
      `Configuration problems (${problems.length}):\n` +
        problems
          .map((p) => `  ${p.key} must ${p.must}${p.must.includes('(got ') ? '' : ` (got ${p.value === '' ? 'nothing' : JSON.stringify(p.value)})`}`)
          .join('\n'),
    );
    this.name = 'ConfigError';
  }
}

/** ConfigModule's `validate`: throws ConfigError listing every bad key; returns the environment unchanged. */
export function validateEnvironment(env: Record<string, unknown>): Record<string, unknown> {
  const { problems } = checkEnvironment(env);
  if (problems.length > 0) throw new ConfigError(problems);
  return env;
}
