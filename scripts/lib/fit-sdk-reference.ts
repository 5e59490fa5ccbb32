// The reference for our FIT decoder: @garmin/fitsdk's Decoder (the FIT SDK's own),
// reduced to what the comparison uses, in the decoder's conventions (Unix seconds,
// NaN for absent, records in stable time order, arrays by their first element), so
// that the differential tests and the fuzzer compare like with like.
import { Decoder, Stream } from '@garmin/fitsdk';
import { FIT_EPOCH_UNIX_SECONDS } from '@shared/analysis/fit-reader';

export interface ReferenceRecords {
  timestamps: number[];
  power: number[];
  cadence: number[];
  /** Right leg's share in percent, read from the balance byte as our decoder reads it. */
  rightBalance: number[];
  temperature: number[];
}

export type ReferenceReading =
  | { readable: true; records: ReferenceRecords; messages: Record<string, unknown[]> }
  | { readable: false; reason: string };

/** Reads the bytes with the SDK; `readable` only when its integrity check passes and it reads without error. */
export function readWithFitSdk(bytes: Uint8Array): ReferenceReading {
  const stream = () => Stream.fromArrayBuffer(bytes.slice().buffer);
  let integrity: boolean;
  try {
    integrity = new Decoder(stream()).checkIntegrity();
  } catch (err) {
    return { readable: false, reason: String(err) };
  }
  if (!integrity) return { readable: false, reason: 'integrity check failed' };
  const { messages, errors } = new Decoder(stream()).read({
    convertTypesToStrings: false,
    convertDateTimesToDates: false,
    expandComponents: false,
    mergeHeartRates: false,
  });
  if (errors.length > 0) return { readable: false, reason: String(errors[0]) };
  const all = (messages.recordMesgs ?? []) as Array<Record<string, unknown>>;
  const timed = all.map((record) => ({ record, time: first(record.timestamp) })).filter(({ time }) => !Number.isNaN(time));
  const order = timed.map((_, i) => i).sort((x, y) => timed[x].time - timed[y].time || x - y);
  const column = (pick: (record: Record<string, unknown>) => number) => order.map((i) => pick(timed[i].record));
  return {
    readable: true,
    messages: messages as Record<string, unknown[]>,
    records: {
      timestamps: order.map((i) => timed[i].time + FIT_EPOCH_UNIX_SECONDS),
      power: column((r) => first(r.power)),
      cadence: column((r) => first(r.cadence)),
      rightBalance: column((r) => rightShare(first(r.leftRightBalance))),
      temperature: column((r) => first(r.temperature)),
    },
  };
}

function first(value: unknown): number {
  const v = Array.isArray(value) ? value[0] : value;
  if (typeof v === 'bigint') return Number(v);
  return typeof v === 'number' ? v : NaN;
}

/** ANT+ Bicycle Power profile, page 0x10: bit 7 set = the low 7 bits are the right leg's share. */
function rightShare(raw: number): number {
  if (Number.isNaN(raw) || (raw & 0x80) === 0) return NaN;
  const percent = raw & 0x7f;
  return percent <= 100 ? percent : NaN;
}
