// What @garmin/fitsdk's Decoder (the reference implementation) reads from a FIT
// file, and the checks that a file stripped of its location decodes to the
// original's messages with every coordinate taken out and nothing else changed.
import { Decoder, Profile, Stream } from '@garmin/fitsdk';
import { expect } from 'vitest';
import { POSITION_DEVELOPER_KEYS } from './gps-fit-files';

type Message = Record<string, unknown> & { developerFields?: Record<string, unknown> };
type ProfileField = { num: number; name: string; units: string };
export type ProfileMessage = { num: number; name: string; fields: Record<string, ProfileField> };

// Names of every coordinate field in the SDK's profile, as its Decoder spells them.
const POSITION_NAMES = new Set(
  (Object.values(Profile.messages) as ProfileMessage[]).flatMap((m) =>
    Object.values(m.fields)
      .filter((f) => f.units === 'semicircles')
      .map((f) => f.name),
  ),
);

export function decodeWithSdk(bytes: Uint8Array) {
  const integrity = new Decoder(Stream.fromArrayBuffer(bytes.slice().buffer)).checkIntegrity();
  const { messages, errors } = new Decoder(Stream.fromArrayBuffer(bytes.slice().buffer)).read({
    convertTypesToStrings: false,
    convertDateTimesToDates: false,
  });
  return { integrity, errors, messages: messages as Record<string, Message[]> };
}

/** The original's messages with every coordinate taken out: what the stripped file must decode to. */
function withoutPositions(messages: Record<string, Message[]>): Record<string, Message[]> {
  return Object.fromEntries(Object.entries(messages).map(([kind, list]) => [kind, list.map(withoutPosition)]));
}

function withoutPosition(message: Message): Message {
  const copy: Message = Object.fromEntries(Object.entries(message).filter(([key]) => !POSITION_NAMES.has(key)));
  if (message.developerFields) {
    copy.developerFields = Object.fromEntries(
      Object.entries(message.developerFields).filter(([key]) => !POSITION_DEVELOPER_KEYS.includes(Number(key))),
    );
  }
  return copy;
}

/** The SDK decodes an invalid float developer field as NaN: drop absent values so both sides compare alike. */
function withoutAbsentValues(messages: Record<string, Message[]>): Record<string, Message[]> {
  return Object.fromEntries(
    Object.entries(messages).map(([kind, list]) => [
      kind,
      list.map((message) => {
        const copy: Message = { ...message };
        if (message.developerFields) {
          copy.developerFields = Object.fromEntries(Object.entries(message.developerFields).filter(([, v]) => !isAbsent(v)));
        }
        return copy;
      }),
    ]),
  );
}

const isAbsent = (value: unknown) => value === null || value === undefined || Number.isNaN(value);

export function coordinatesIn(messages: Record<string, Message[]>): string[] {
  const found: string[] = [];
  for (const [kind, list] of Object.entries(messages)) {
    for (const message of list) {
      for (const [key, value] of Object.entries(message)) if (POSITION_NAMES.has(key) && !isAbsent(value)) found.push(`${kind}.${key}`);
      for (const key of POSITION_DEVELOPER_KEYS) {
        if (!isAbsent(message.developerFields?.[key])) found.push(`${kind}.developerFields.${key}`);
      }
    }
  }
  return found;
}

/** The stripped file checks, and decodes to the original's messages minus every coordinate. */
export function expectStrippedLikeOriginal(original: Uint8Array, stripped: Uint8Array) {
  const before = decodeWithSdk(original);
  const after = decodeWithSdk(stripped);
  expect(before.errors).toEqual([]);
  expect(coordinatesIn(before.messages).length).toBeGreaterThan(0);
  expect(after.integrity).toBe(true);
  expect(after.errors).toEqual([]);
  expect(coordinatesIn(after.messages)).toEqual([]);
  expect(withoutAbsentValues(after.messages)).toEqual(withoutPositions(before.messages));
}
