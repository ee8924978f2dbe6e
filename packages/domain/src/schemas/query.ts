// Numbers read from text (query strings, form fields): plain decimal notation only, nothing guessed.
import { z } from 'zod';

// optional sign, digits with an optional fraction, an optional exponent: what String(number) writes
const DECIMAL = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;

/**
 * Reads a number sent as text, then checks it with `schema` (a number schema with its limits).
 * Unlike z.coerce.number(), an empty or blank value is not 0 and "0x10" or "0b1" are not numbers:
 * each is refused with `message`. Numbers (JSON bodies) pass through unchanged.
 */
export function queryNumber<T extends z.ZodType>(schema: T, message = 'Enter a number in digits, e.g. 12 or 47.5') {
  return z.preprocess((value, ctx) => {
    if (typeof value !== 'string') return value;
    if (DECIMAL.test(value)) return Number(value);
    ctx.addIssue({ code: 'custom', message, input: value });
    return z.NEVER;
  }, schema);
}
