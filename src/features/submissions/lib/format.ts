// The ride result's figures, written the way src/lib/format-figures.ts writes every figure.
import { NONE, signed } from '@/lib/format-figures';

export function formatSignedWatts(value: number | null | undefined, digits = 0): string {
  return value == null ? NONE : `${signed(value, digits)} W`;
}

export function formatWatts(value: number | null | undefined): string {
  return value == null ? NONE : `${Math.round(value)} W`;
}

export function formatSignedSeconds(value: number | null | undefined): string {
  return value == null ? NONE : `${signed(value, 0)} s`;
}

/** `+1.8 % (LoA −4.2 to +7.9 %)` */
export function formatLimitsOfAgreement(lower: number | null, upper: number | null): string {
  if (lower == null || upper == null) return NONE;
  return `${signed(lower, 1)} to ${signed(upper, 1)} %`;
}

export function formatDuration(seconds: number | null | undefined): string {
  if (seconds == null) return NONE;
  const total = Math.round(seconds);
  const h = Math.floor(total / 3600);
  const m = Math.floor((total % 3600) / 60);
  const s = total % 60;
  if (h > 0) return `${h} h ${String(m).padStart(2, '0')} min`;
  if (m > 0) return s === 0 ? `${m} min` : `${m} min ${s} s`;
  return `${s} s`;
}

/** Ride clock for a chart axis or table: 1:05:09 or 5:09. */
export function formatClock(seconds: number): string {
  const total = Math.max(0, Math.round(seconds));
  const h = Math.floor(total / 3600);
  const m = Math.floor((total % 3600) / 60);
  const s = String(total % 60).padStart(2, '0');
  return h > 0 ? `${h}:${String(m).padStart(2, '0')}:${s}` : `${m}:${s}`;
}

export function formatFileSize(bytes: number): string {
  if (bytes < 1024) return `${bytes} B`;
  if (bytes < 1024 * 1024) return `${(bytes / 1024).toFixed(0)} kB`;
  return `${(bytes / (1024 * 1024)).toFixed(1)} MB`;
}
