// Test fixture: reads a FIT file with @garmin/fitsdk's Decoder, the reference
// implementation, into plain arrays (raw values: FIT times, enums as numbers).
import { Decoder, Stream } from '@garmin/fitsdk';

export interface SdkDecodedRecords {
  integrity: boolean;
  errors: unknown[];
  messages: Record<string, Array<Record<string, unknown>>>;
  /** Unix seconds. */
  timestamps: number[];
  power: Array<number | undefined>;
  cadence: Array<number | undefined>;
  balance: Array<number | undefined>;
}

const FIT_EPOCH_UNIX_SECONDS = 631065600; // FIT SDK profile: Unix = FIT + 631065600

export function decodeWithSdk(bytes: Uint8Array): SdkDecodedRecords {
  const integrity = new Decoder(Stream.fromArrayBuffer(bytes.slice().buffer)).checkIntegrity();
  const { messages, errors } = new Decoder(Stream.fromArrayBuffer(bytes.slice().buffer)).read({
    convertTypesToStrings: false,
    convertDateTimesToDates: false,
  });
  const records = (messages.recordMesgs ?? []) as Array<Record<string, number | undefined>>;
  return {
    integrity,
    errors,
    messages: messages as SdkDecodedRecords['messages'],
    timestamps: records.map((record) => (record.timestamp as number) + FIT_EPOCH_UNIX_SECONDS),
    power: records.map((record) => record.power),
    cadence: records.map((record) => record.cadence),
    balance: records.map((record) => record.leftRightBalance),
  };
}
