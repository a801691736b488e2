// Broken text stops at the edge. A path with malformed percent-encoding is a 400 (the router's
// decoder would throw, and that was a 500); a JSON string with an unpaired UTF-16 surrogate is
// repaired to U+FFFD, since MariaDB refuses such a string inside a JSON column.
import type { RequestHandler } from 'express';
import { HttpError } from './errors';

const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/g;

/** The text with each unpaired surrogate replaced by U+FFFD; pairs (emoji) stay as they are. */
export const wellFormed = (text: string): string => text.replace(LONE_SURROGATE, '\uFFFD');

/**
 * JSON.parse reviver (bottom-up, so each value is seen once): repairs string values, and the keys
 * of an object when one of them is broken.
 */
export function repairingReviver(_key: string, value: unknown): unknown {
  if (typeof value === 'string') return wellFormed(value);
  if (value && typeof value === 'object' && !Array.isArray(value)) {
    const keys = Object.keys(value);
    if (keys.some((k) => wellFormed(k) !== k)) {
      return Object.fromEntries(keys.map((k) => [wellFormed(k), (value as Record<string, unknown>)[k]]));
    }
  }
  return value;
}

export const rejectMalformedPath: RequestHandler = (req, _res, next) => {
  try {
    decodeURIComponent(req.path);
  } catch {
    return next(new HttpError(400, 'bad_encoding', 'The address has a malformed percent-encoding (a % not followed by two hex digits of valid UTF-8).'));
  }
  next();
};
