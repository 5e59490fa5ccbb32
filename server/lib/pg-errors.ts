// PostgreSQL error codes we turn into answers a person understands.
export const UNIQUE_VIOLATION = '23505';

export function isUniqueViolation(err: unknown): boolean {
  return typeof err === 'object' && err !== null && (err as { code?: string }).code === UNIQUE_VIOLATION;
}

// Data exceptions caused by what the request carried: an id beyond `integer`
// (22003), text PostgreSQL cannot parse as the column's type (22P02), or a NUL
// character in text (22021). The schemas let these through; they are still the
// request's fault, so they answer 400 rather than 500.
const BAD_INPUT_CODES = new Set(['22003', '22P02', '22021']);

export function isBadInputValue(err: unknown): boolean {
  return typeof err === 'object' && err !== null && BAD_INPUT_CODES.has((err as { code?: string }).code ?? '');
}
