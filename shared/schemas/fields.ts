import { z } from 'zod';

// Building blocks every request schema uses, so the rules live once.

/** Control characters other than line breaks and tabs; never part of text people read. */
const CONTROL_CHARS = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f-\u009f\u2028\u2029]/;
const LINE_BREAKS = /[\r\n\t]/;

/** Text on one line (names, titles, versions, short notes): any control character, CR or LF is refused. */
export function singleLineText() {
  return z.string().refine((s) => !CONTROL_CHARS.test(s) && !LINE_BREAKS.test(s), 'one line of plain text, without control characters');
}

/** Text that may span lines (post bodies, notes): line breaks and tabs allowed, other control characters refused. */
export function multiLineText() {
  return z.string().refine((s) => !CONTROL_CHARS.test(s), 'contains characters that are not text');
}

// JSON sends numbers; forms, query strings and multipart fields send digits as text.
// Anything else (true, [], "") is refused rather than coerced (true would read as 1).
const digits = z
  .string()
  .trim()
  .regex(/^-?\d+$/)
  .transform(Number);

/** A whole number from JSON or from a query string/form field. */
export function wholeNumber(message = 'a whole number') {
  return z.union([z.number(), digits], { error: message }).pipe(z.number().int(message));
}

/** A row id: a positive whole number. */
export function idNumber(message = 'an id (a positive whole number)') {
  return z.union([z.number(), digits], { error: message }).pipe(z.number().int(message).positive(message));
}

/** A page number or another bounded count from a query string. */
export function boundedWholeNumber(min: number, max: number, message = `a whole number from ${min} to ${max}`) {
  return z.union([z.number(), digits], { error: message }).pipe(z.number().int(message).min(min, message).max(max, message));
}
