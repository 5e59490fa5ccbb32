// Looks through a response body (JSON or CSV) for what the public must never get:
// device serial numbers, e-mail addresses, device ids, file hashes, coordinates
// and times finer than a day. It reads every key and every value, so a new field
// is checked as soon as it exists, whatever it is called.

export interface Finding {
  path: string;
  what: string;
}

export interface KnownSecrets {
  /** Serial numbers written into the test's FIT files. */
  serialNumbers: ReadonlySet<number>;
}

const PRIVATE_KEY: Array<[RegExp, string]> = [
  [/serial/i, 'serial number'],
  [/e-?mail/i, 'e-mail address'],
  [/sha-?\d+|hash|checksum|digest/i, 'file hash'],
  [/device_?info|^device_?id$|^creator$|power_?meter_?id|manufacturer_?id|product_?id/i, 'device id'],
  [/latitude|longitude|^lat$|^lng$|^lon$|^long$|position_?(lat|long)|coordinates?|geo/i, 'coordinate'],
];

const EMAIL = /[^\s@"<>(),;]+@[^\s@"<>(),;]+\.[a-z]{2,}/i;
const HEX_HASH = /\b[0-9a-f]{32,}\b/i;
/** A date with a time of day, in ISO or SQL form. */
const TIME_OF_DAY = /\d{4}-\d{2}-\d{2}[T ]\d{2}:\d{2}/;

/** Unix seconds or milliseconds between 2001 and 2286: a clock time, finer than a day. */
function looksLikeEpoch(value: number): boolean {
  return (value >= 1e9 && value < 1e10) || (value >= 1e12 && value < 1e13);
}

function checkKey(key: string, path: string, out: Finding[]) {
  for (const [pattern, what] of PRIVATE_KEY) if (pattern.test(key)) out.push({ path, what: `${what} (key "${key}")` });
}

function checkValue(value: unknown, path: string, secrets: KnownSecrets, out: Finding[]) {
  if (typeof value === 'number') {
    if (looksLikeEpoch(value)) out.push({ path, what: `clock time (${value})` });
    if (secrets.serialNumbers.has(value)) out.push({ path, what: `serial number (${value})` });
    return;
  }
  if (typeof value !== 'string') return;
  if (EMAIL.test(value)) out.push({ path, what: `e-mail address (${EMAIL.exec(value)![0]})` });
  if (HEX_HASH.test(value)) out.push({ path, what: `file hash (${HEX_HASH.exec(value)![0].slice(0, 12)}…)` });
  if (TIME_OF_DAY.test(value)) out.push({ path, what: `time finer than a day (${TIME_OF_DAY.exec(value)![0]})` });
  for (const token of value.match(/\b\d{5,13}\b/g) ?? []) {
    const number = Number(token);
    if (secrets.serialNumbers.has(number)) out.push({ path, what: `serial number (${token})` });
    else if (looksLikeEpoch(number)) out.push({ path, what: `clock time (${token})` });
  }
}

export function findPrivateData(body: unknown, secrets: KnownSecrets, path = '$'): Finding[] {
  const out: Finding[] = [];
  const walk = (value: unknown, at: string) => {
    if (Array.isArray(value)) {
      for (const [i, item] of value.entries()) walk(item, `${at}[${i}]`);
    } else if (value && typeof value === 'object') {
      for (const [key, item] of Object.entries(value)) {
        checkKey(key, `${at}.${key}`, out);
        walk(item, `${at}.${key}`);
      }
    } else checkValue(value, at, secrets, out);
  };
  walk(body, path);
  return out;
}

/** CSV: the header names are keys, every cell a value (numbers parsed). */
export function findPrivateDataInCsv(text: string, secrets: KnownSecrets, path = '$'): Finding[] {
  const rows = parseCsv(text);
  const [header = [], ...body] = rows;
  const out: Finding[] = [];
  for (const name of header) checkKey(name, `${path}[header].${name}`, out);
  for (const [r, row] of body.entries()) {
    for (const [c, cell] of row.entries()) {
      const at = `${path}[${r + 1}].${header[c] ?? c}`;
      const number = cell.trim() === '' ? Number.NaN : Number(cell);
      checkValue(Number.isFinite(number) ? number : cell, at, secrets, out);
    }
  }
  return out;
}

/** RFC 4180: quoted fields may hold commas, quotes ("") and line breaks. */
export function parseCsv(text: string): string[][] {
  const rows: string[][] = [];
  let row: string[] = [];
  let cell = '';
  let quoted = false;
  for (let i = 0; i < text.length; i++) {
    const ch = text[i]!;
    if (quoted) {
      if (ch === '"' && text[i + 1] === '"') {
        cell += '"';
        i++;
      } else if (ch === '"') quoted = false;
      else cell += ch;
    } else if (ch === '"') quoted = true;
    else if (ch === ',') {
      row.push(cell);
      cell = '';
    } else if (ch === '\n' || ch === '\r') {
      if (ch === '\r' && text[i + 1] === '\n') i++;
      row.push(cell);
      rows.push(row);
      row = [];
      cell = '';
    } else cell += ch;
  }
  if (cell !== '' || row.length > 0) {
    row.push(cell);
    rows.push(row);
  }
  return rows.filter((r) => r.some((c) => c !== ''));
}
