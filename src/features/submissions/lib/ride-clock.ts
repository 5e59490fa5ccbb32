/** Reads a ride time typed as 1:05:09, 5:09, 12 min or plain seconds; null when it is not one. */
export function parseClock(text: string): number | null {
  const value = text.trim();
  if (/^\d+(\.\d+)?$/.test(value)) return Number(value);
  const minutes = /^(\d+(?:\.\d+)?)\s*min$/.exec(value);
  if (minutes) return Math.round(Number(minutes[1]) * 60);
  const parts = /^(?:(\d+):)?(\d{1,2}):(\d{2})$/.exec(value);
  if (!parts) return null;
  const [, h, m, s] = parts;
  if (Number(s) > 59 || (h !== undefined && Number(m) > 59)) return null;
  return Number(h ?? 0) * 3600 + Number(m) * 60 + Number(s);
}
