// Reading the processor's form-encoded parameters after qs has turned the bracket notation
// (line_items[0][price_data][unit_amount]=…) into nested values. Every value arrives as a string.
import { invalid, missing } from './errors';
import type { Metadata } from './types';

export type Params = Record<string, unknown>;

const INTEGER = /^-?\d+$/;

export function optString(params: Params, key: string, path = key): string | undefined {
  const v = params[key];
  if (v === undefined || v === '') return undefined;
  if (typeof v !== 'string') throw invalid(path, `Invalid string: ${path}`, 'parameter_invalid_string');
  return v;
}

export function reqString(params: Params, key: string, path = key): string {
  const v = optString(params, key, path);
  if (v === undefined) throw missing(path);
  return v;
}

/** An integer amount or count. Integers in minor units are exact in a double up to 2^53. */
export function optInteger(params: Params, key: string, path = key): number | undefined {
  const v = params[key];
  if (v === undefined || v === '') return undefined;
  if (typeof v !== 'string' || !INTEGER.test(v) || !Number.isSafeInteger(Number(v)))
    throw invalid(path, `Invalid integer: ${String(v)}`, 'parameter_invalid_integer');
  return Number(v);
}

export function reqInteger(params: Params, key: string, path = key): number {
  const v = optInteger(params, key, path);
  if (v === undefined) throw missing(path);
  return v;
}

export function optObject(params: Params, key: string, path = key): Params | undefined {
  const v = params[key];
  if (v === undefined || v === '') return undefined;
  if (typeof v !== 'object' || v === null || Array.isArray(v))
    throw invalid(path, `Invalid object: ${path}`, 'parameter_invalid_object');
  return v as Params;
}

/** qs gives an array for arr[0]…arr[n], or an object with numeric keys beyond its array limit. */
export function optArray(params: Params, key: string, path = key): unknown[] | undefined {
  const v = params[key];
  if (v === undefined || v === '') return undefined;
  if (Array.isArray(v)) return v;
  if (typeof v === 'string') return [v];
  if (typeof v === 'object' && v !== null) {
    const keys = Object.keys(v);
    if (keys.every((k) => /^\d+$/.test(k)))
      return keys.sort((a, b) => Number(a) - Number(b)).map((k) => (v as Params)[k]);
  }
  throw invalid(path, `Invalid array: ${path}`, 'parameter_invalid_array');
}

/** Metadata: up to 50 keys, key ≤ 40 characters, value ≤ 500 characters (Stripe API reference, memory). */
export function metadata(params: Params, key = 'metadata', path = key): Metadata {
  const m = optObject(params, key, path) ?? {};
  const out: Metadata = {};
  const keys = Object.keys(m);
  if (keys.length > 50)
    throw invalid(path, 'Metadata can have at most 50 keys.', 'parameter_invalid_metadata');
  for (const k of keys) {
    const v = m[k];
    if (typeof v !== 'string') throw invalid(`${path}[${k}]`, `Invalid string: ${path}[${k}]`);
    if (k.length > 40 || v.length > 500)
      throw invalid(`${path}[${k}]`, 'Metadata keys are at most 40 and values at most 500 characters.');
    if (v !== '') out[k] = v;
  }
  return out;
}

export function expandPaths(params: Params): string[] {
  return (optArray(params, 'expand') ?? []).map((p) => String(p));
}
