/** Reading the form-encoded parameters of the fake's API, and its errors in the service's JSON shape. */
import type qs from 'qs';

export type Params = qs.ParsedQs;

/** The service's error JSON: `{ error: { type, code, message, param?, decline_code? } }`; the SDK maps status and type to its error classes. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly type: 'invalid_request_error' | 'idempotency_error' | 'card_error' | 'api_error',
    message: string,
    readonly code?: string,
    readonly param?: string,
  ) {
    super(message);
  }
  toJSON() {
    return { error: { type: this.type, message: this.message, ...(this.code ? { code: this.code } : {}), ...(this.param ? { param: this.param } : {}) } };
  }
}

/** The service's usual refusal: 400 (or `status`), type invalid_request_error. */
export function invalid(message: string, code?: string, param?: string, status = 400): ApiError {
  return new ApiError(status, 'invalid_request_error', message, code, param);
}

export function isParams(value: unknown): value is Params {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

/** Refuses parameters the fake does not know, as the service does, so a typo shows at once. */
export function only(params: Params, allowed: Set<string>): void {
  const unknown = Object.keys(params).find((name) => !allowed.has(name));
  if (unknown) throw invalid(`Received unknown parameter: ${unknown}`, 'parameter_unknown', unknown);
}

export function text(params: Params, name: string, rule: { required?: boolean; param?: string; max?: number } = {}): string {
  const value = params[name];
  const param = rule.param ?? name;
  if (value === undefined || value === '') {
    if (rule.required) throw invalid(`Missing required param: ${param}.`, 'parameter_missing', param);
    return '';
  }
  if (typeof value !== 'string') throw invalid(`Invalid string: ${param}.`, 'parameter_invalid', param);
  if (rule.max !== undefined && value.length > rule.max) {
    throw invalid(`Invalid string: ${param} must be at most ${rule.max} characters.`, 'parameter_invalid', param);
  }
  return value;
}

export function integer(value: unknown, param: string, min: number): number {
  if (value === undefined) throw invalid(`Missing required param: ${param}.`, 'parameter_missing', param);
  const n = typeof value === 'string' && /^\d{1,15}$/.test(value) ? Number(value) : NaN;
  if (!(n >= min)) {
    throw invalid(`Invalid ${min > 0 ? 'positive' : 'non-negative'} integer: ${param}.`, 'parameter_invalid_integer', param);
  }
  return n;
}

export function webUrl(params: Params, name: string, required: boolean): string | null {
  const value = text(params, name, { required, max: 5000 });
  if (!value) return null;
  if (!URL.canParse(value) || !['http:', 'https:'].includes(new URL(value).protocol)) throw invalid(`Not a valid URL: ${name}.`, 'url_invalid', name);
  return value;
}

/** The service's metadata rules: at most 50 keys, keys up to 40 characters, string values up to 500. */
export function metadata(params: Params): Record<string, string> {
  const given = params.metadata;
  if (given === undefined || given === '') return {};
  if (!isParams(given)) throw invalid('Invalid object: metadata.', 'parameter_invalid', 'metadata');
  const entries = Object.entries(given);
  if (entries.length > 50) throw invalid('metadata may have at most 50 keys.', 'parameter_invalid', 'metadata');
  const result: Record<string, string> = {};
  for (const [key, value] of entries) {
    if (typeof value !== 'string' || key.length > 40 || value.length > 500) {
      throw invalid(`Invalid metadata[${key}]: keys up to 40 characters, string values up to 500.`, 'parameter_invalid', `metadata[${key}]`);
    }
    result[key] = value;
  }
  return result;
}

export function expandList(params: Params, expandable: string[]): string[] {
  const given = params.expand;
  const list = given === undefined ? [] : Array.isArray(given) ? given : [given];
  for (const item of list) {
    if (typeof item !== 'string' || !expandable.includes(item)) {
      throw invalid(`This property cannot be expanded (${String(item)}).`, 'parameter_invalid', 'expand');
    }
  }
  return list as string[];
}
