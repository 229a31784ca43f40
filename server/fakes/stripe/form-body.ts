/**
 * Stripe's request encoding: application/x-www-form-urlencoded with bracket notation
 * (`metadata[tenantId]=…`, `line_items[0][price]=…`, `expand[]=…`), in the body or the query.
 * `FormParams` reads values by their bracket name, which is also the name errors report.
 */
import express, { type RequestHandler } from 'express';
import qs from 'qs';
import { stripeErrors } from './errors';
import type { Metadata } from './objects';

export function parseForm(text: string): Record<string, unknown> {
  return qs.parse(text, { depth: 10, arrayLimit: 100 });
}

const readText = express.text({ type: 'application/x-www-form-urlencoded', limit: '256kb' });

/** Puts the parsed form on req.body (an empty object when there is none). */
export const formBody: RequestHandler = (req, res, next) => {
  readText(req, res, (err?: unknown) => {
    if (err) {
      next(err);
      return;
    }
    req.body = parseForm(typeof req.body === 'string' ? req.body : '');
    next();
  });
};

function splitName(name: string): string[] {
  // "line_items[0][price]" -> ["line_items", "0", "price"]; "expand[]" -> ["expand"]
  return name
    .replace(/\[\]$/, '')
    .split(/\[|\]\[|\]/)
    .filter((part) => part !== '');
}

function isRecord(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

export class FormParams {
  private readonly values: Record<string, unknown>;

  constructor(...sources: unknown[]) {
    // Later sources win; in practice one is the query and one the body.
    this.values = Object.assign({}, ...sources.filter(isRecord)) as Record<string, unknown>;
  }

  /** the top-level parameter names given */
  names(): string[] {
    return Object.keys(this.values);
  }

  /** how many entries a nested list (`items[0][…]`, `items[1][…]`) has */
  count(name: string): number {
    const value = this.raw(name);
    if (Array.isArray(value)) return value.length;
    if (isRecord(value)) return Object.keys(value).length;
    return value === undefined ? 0 : 1;
  }

  has(name: string): boolean {
    return this.raw(name) !== undefined;
  }

  raw(name: string): unknown {
    let current: unknown = this.values;
    for (const key of splitName(name)) {
      if (Array.isArray(current)) current = current[Number(key)];
      else if (isRecord(current)) current = current[key];
      else return undefined;
    }
    return current;
  }

  /** a string value; '' stays '' (Stripe's way of clearing a field) */
  string(name: string): string | undefined {
    const value = this.raw(name);
    if (value === undefined) return undefined;
    if (typeof value !== 'string') throw stripeErrors.invalidParam(name, `Invalid string: ${name} must be a single value.`);
    return value;
  }

  requiredString(name: string): string {
    const value = this.string(name);
    if (value === undefined || value === '') throw stripeErrors.missingParam(name);
    return value;
  }

  integer(name: string): number | undefined {
    const value = this.string(name);
    if (value === undefined || value === '') return undefined;
    if (!/^-?\d+$/.test(value)) throw stripeErrors.invalidParam(name, `Invalid integer: ${value}`);
    return Number(value);
  }

  boolean(name: string): boolean | undefined {
    const value = this.string(name);
    if (value === undefined) return undefined;
    if (value === 'true') return true;
    if (value === 'false') return false;
    throw stripeErrors.invalidParam(name, `Invalid boolean: ${value}`);
  }

  /** a list given as `name[]=a&name[]=b`, `name[0]=a`, or a single `name=a` */
  list(name: string): string[] {
    const value = this.raw(name);
    if (value === undefined || value === '') return [];
    const items = Array.isArray(value) ? (value as unknown[]) : isRecord(value) ? Object.values(value) : [value];
    return items.map((item) => {
      if (typeof item !== 'string') throw stripeErrors.invalidParam(name, `Invalid array: ${name} must hold strings.`);
      return item;
    });
  }

  /** metadata as given; a key sent as '' means "remove this key" when merged */
  metadata(name = 'metadata'): Metadata | undefined {
    const value = this.raw(name);
    if (value === undefined) return undefined;
    if (value === '') return {};
    if (!isRecord(value)) throw stripeErrors.invalidParam(name, `Invalid hash: ${name} must be a set of key-value pairs.`);
    const out: Metadata = {};
    for (const [key, item] of Object.entries(value)) {
      if (typeof item !== 'string')
        throw stripeErrors.invalidParam(`${name}[${key}]`, `Invalid value for ${name}[${key}]: metadata values are strings.`);
      out[key] = item;
    }
    return out;
  }

  /** a http(s) URL, checked because pages put it in links */
  url(name: string): string | undefined {
    const value = this.string(name);
    if (value === undefined || value === '') return undefined;
    if (!isHttpUrl(value)) throw stripeErrors.invalidParam(name, `Not a valid URL: ${name} must be an http or https address.`);
    return value;
  }
}

export function isHttpUrl(value: string): boolean {
  // {CHECKOUT_SESSION_ID} is not valid in a URL as written; check the address with it filled in.
  const candidate = value.replaceAll('{CHECKOUT_SESSION_ID}', 'cs_test_placeholder');
  if (!URL.canParse(candidate)) return false;
  const { protocol } = new URL(candidate);
  return protocol === 'http:' || protocol === 'https:';
}

/** Merges metadata as Stripe does: new keys are added, keys sent empty are removed. */
export function mergeMetadata(current: Metadata, changes: Metadata): Metadata {
  const out: Metadata = { ...current };
  for (const [key, value] of Object.entries(changes)) {
    if (value === '') delete out[key];
    else out[key] = value;
  }
  return out;
}
