import type { RequestHandler } from 'express';
import { z } from 'zod';
import { HttpError } from '../http-error';
import { HttpStatus } from '../http-status';

function fieldLabel(path: readonly PropertyKey[]): string {
  return path.length === 0 ? 'The request' : `Field "${path.map(String).join('.')}"`;
}

/** Sentences for zod's built-in checks. Messages written on a schema itself
 * (`{ error: '…' }`) take precedence over these, as zod ranks a schema's own
 * error above a per-parse one. */
const sentenceForIssue: z.core.$ZodErrorMap = (issue) => {
  const field = fieldLabel(issue.path ?? []);
  switch (issue.code) {
    case 'invalid_type':
      return issue.input === undefined ? `${field} is required.` : `${field} must be a ${issue.expected}.`;
    case 'too_small':
      if (issue.origin === 'string') {
        return Number(issue.minimum) <= 1 ? `${field} must not be empty.` : `${field} must be at least ${issue.minimum} characters long.`;
      }
      if (issue.origin === 'array' || issue.origin === 'set') return `${field} must have at least ${issue.minimum} item(s).`;
      return `${field} must be at least ${issue.minimum}${issue.inclusive === false ? ' (exclusive)' : ''}.`;
    case 'too_big':
      if (issue.origin === 'string') return `${field} must be at most ${issue.maximum} characters long.`;
      if (issue.origin === 'array' || issue.origin === 'set') return `${field} must have at most ${issue.maximum} item(s).`;
      return `${field} must be at most ${issue.maximum}${issue.inclusive === false ? ' (exclusive)' : ''}.`;
    case 'invalid_format':
      return `${field} is not a valid ${issue.format === 'email' ? 'e-mail address' : issue.format}.`;
    case 'invalid_value':
      return `${field} must be one of: ${issue.values.map((v) => JSON.stringify(v)).join(', ')}.`;
    case 'unrecognized_keys':
      return `${field} has unexpected field(s): ${issue.keys.join(', ')}.`;
    case 'not_multiple_of':
      return `${field} must be a multiple of ${issue.divisor}.`;
    default:
      return `${field} is not valid.`;
  }
};

/** Paths (a.b.0) of string values holding U+0000, which PostgreSQL text cannot store. */
function pathsWithNul(value: unknown, path: string[] = [], found: string[] = []): string[] {
  if (typeof value === 'string') {
    if (value.includes('\u0000')) found.push(path.join('.') || '_');
  } else if (Array.isArray(value)) {
    value.forEach((item, index) => pathsWithNul(item, [...path, String(index)], found));
  } else if (value !== null && typeof value === 'object') {
    for (const [key, item] of Object.entries(value)) pathsWithNul(item, [...path, key], found);
  }
  return found;
}

export function parseOrThrow<T extends z.ZodType>(schema: T, input: unknown, what: 'body' | 'query' | 'params'): z.output<T> {
  const withNul = pathsWithNul(input);
  if (withNul.length > 0) {
    const fields = Object.fromEntries(withNul.map((key) => [key, `${fieldLabel(key === '_' ? [] : key.split('.'))} must not contain a NUL character (U+0000).`]));
    throw new HttpError(HttpStatus.BAD_REQUEST, `Some fields need attention: ${withNul.join(', ')}.`, fields);
  }
  const result = schema.safeParse(input, { error: sentenceForIssue });
  if (result.success) return result.data;
  const fields: Record<string, string> = {};
  for (const issue of result.error.issues) {
    const key = issue.path.map(String).join('.') || '_';
    fields[key] ??= issue.message;
  }
  const names = Object.keys(fields).filter((key) => key !== '_');
  const message =
    names.length > 0
      ? `Some fields need attention: ${names.join(', ')}.`
      : (fields._ ?? `The request ${what} is not valid.`);
  throw new HttpError(HttpStatus.BAD_REQUEST, message, fields);
}

/** Parses `req.body`; the parsed value replaces it and is also `res.locals.body`. */
export function validateBody<T extends z.ZodType>(schema: T): RequestHandler {
  return (req, res, next) => {
    const parsed = parseOrThrow(schema, req.body ?? {}, 'body');
    req.body = parsed;
    res.locals.body = parsed;
    next();
  };
}

/** Parses `req.query` into `res.locals.query` (Express 5's req.query is read-only). */
export function validateQuery<T extends z.ZodType>(schema: T): RequestHandler {
  return (req, res, next) => {
    res.locals.query = parseOrThrow(schema, req.query, 'query');
    next();
  };
}

/** Parses `req.params` into `res.locals.params`. */
export function validateParams<T extends z.ZodType>(schema: T): RequestHandler {
  return (req, res, next) => {
    res.locals.params = parseOrThrow(schema, req.params, 'params');
    next();
  };
}
