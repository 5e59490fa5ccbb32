import { Profile } from '@garmin/fitsdk';
import { describe, expect, it } from 'vitest';
import { crc16Arc } from '@shared/analysis/fit-crc';
import { isPositionDeveloperField, POSITION_FIELDS } from '@shared/fit/position-fields';
import { FitStructureError, stripFitLocation } from '@shared/fit/strip-location';
import { chained, encodeActivityWithGps, encodeCompressedTimestampFile, withShortHeader, withZeroHeaderCrc } from './gps-fit-files';
import { expectStrippedLikeOriginal, type ProfileMessage } from './sdk-messages';

describe('stripping location from a FIT file', () => {
  it('when a file written by the SDK Encoder with GPS everywhere is stripped, then the SDK Decoder finds no coordinate and every other message and field unchanged', () => {
    // Arrange
    const original = encodeActivityWithGps({ seconds: 300 });

    // Act
    const stripped = stripFitLocation(original);

    // Assert
    expectStrippedLikeOriginal(original, stripped.bytes);
    expect(stripped.bytes.length).toBe(original.length);
    expect(Buffer.from(stripped.bytes.subarray(0, 14)).equals(Buffer.from(original.subarray(0, 14)))).toBe(true);
    // 300 records × 5 positions (2 native, 3 developer); lap, session, segment lap 8 each; course point, segment point, gps, weather 2 each.
    expect(stripped.clearedFields).toBe(300 * 5 + 3 * 8 + 4 * 2);
    expect(stripped.fileCount).toBe(1);
  });

  it('when a file is stripped, then only the coordinate bytes and the CRC differ from the original', () => {
    const original = encodeActivityWithGps({ seconds: 20 });

    const stripped = stripFitLocation(original).bytes;

    const changed = [...original.keys()].filter((i) => original[i] !== stripped[i]);
    const invalidPatternBytes = new Set([0xff, 0x7f]);
    const crcStart = original.length - 2;
    expect(changed.filter((i) => i < crcStart && !invalidPatternBytes.has(stripped[i]))).toEqual([]);
    // Each changed value holds at most 4 bytes; 20 records × 5, 3 × 8 and 4 × 2 values, and the CRC.
    expect(changed.filter((i) => i < crcStart).length).toBeLessThanOrEqual((20 * 5 + 24 + 8) * 4);
  });

  it('when the file has a 12-byte header, then it is stripped the same way and still checks', () => {
    const original = withShortHeader(encodeActivityWithGps({ seconds: 60 }));

    const stripped = stripFitLocation(original);

    expect(stripped.bytes[0]).toBe(12);
    expectStrippedLikeOriginal(original, stripped.bytes);
  });

  it('when the 14-byte header carries a CRC of 0, then the header is kept as it is and the file still checks', () => {
    const original = withZeroHeaderCrc(encodeActivityWithGps({ seconds: 60 }));

    const stripped = stripFitLocation(original);

    expect([stripped.bytes[12], stripped.bytes[13]]).toEqual([0, 0]);
    expectStrippedLikeOriginal(original, stripped.bytes);
  });

  it('when two files are chained, then both are stripped and each keeps a valid CRC', () => {
    const original = chained(
      encodeActivityWithGps({ seconds: 60, seed: 1 }),
      withShortHeader(encodeActivityWithGps({ seconds: 90, seed: 2 })),
    );

    const stripped = stripFitLocation(original);

    expect(stripped.fileCount).toBe(2);
    expect(stripped.bytes.length).toBe(original.length);
    expectStrippedLikeOriginal(original, stripped.bytes);
  });

  it('when records use compressed-timestamp headers and big-endian fields, then exactly the position bytes are cleared', () => {
    const original = encodeCompressedTimestampFile(40);

    const stripped = stripFitLocation(original.bytes);

    const positionBytes = new Set(original.positionOffsets.flatMap((offset) => [offset, offset + 1, offset + 2, offset + 3]));
    const crcStart = original.bytes.length - 2;
    expect(stripped.clearedFields).toBe(40 * 2);
    for (const offset of original.positionOffsets) {
      expect([...stripped.bytes.subarray(offset, offset + 4)]).toEqual([0x7f, 0xff, 0xff, 0xff]); // sint32 invalid, big-endian
    }
    const changedElsewhere = [...original.bytes.keys()].filter(
      (i) => i < crcStart && !positionBytes.has(i) && original.bytes[i] !== stripped.bytes[i],
    );
    expect(changedElsewhere).toEqual([]);
    const view = new DataView(stripped.bytes.buffer, stripped.bytes.byteOffset);
    expect(view.getUint16(crcStart, true)).toBe(crc16Arc(stripped.bytes, 0, crcStart));
  });

  it('when a recording was cut short in the middle of a record, then what is there is stripped and nothing else changes', () => {
    const full = encodeActivityWithGps({ seconds: 120 });
    const cut = full.subarray(0, Math.floor(full.length * 0.6));

    const stripped = stripFitLocation(cut);

    expect(stripped.bytes.length).toBe(cut.length);
    expect(Buffer.from(stripped.bytes).equals(Buffer.from(stripFitLocation(full).bytes.subarray(0, cut.length)))).toBe(true);
  });

  it('when a file is followed by bytes that are not a FIT file, then the copy leaves them out', () => {
    const file = encodeActivityWithGps({ seconds: 30 });
    const original = chained(file, new Uint8Array([1, 2, 3, 4, 5]));

    const stripped = stripFitLocation(original);

    expect(stripped.droppedTrailingBytes).toBe(5);
    expect(stripped.bytes.length).toBe(file.length);
  });

  it('when the bytes are not a FIT file or a message has no definition, then it refuses', () => {
    expect(() => stripFitLocation(new TextEncoder().encode('not a fit file at all'))).toThrow(FitStructureError);
    const broken = encodeActivityWithGps({ seconds: 10 }).slice();
    broken[14] = 0x0f; // the first record header now names a local type never defined
    expect(() => stripFitLocation(broken)).toThrow(FitStructureError);
  });
});

describe('which fields are positions', () => {
  it('when our table is compared with the SDK profile, then it lists exactly the fields whose unit is semicircles', () => {
    const fromProfile = new Map<number, Set<number>>();
    for (const message of Object.values(Profile.messages) as ProfileMessage[]) {
      for (const field of Object.values(message.fields)) {
        if (field.units !== 'semicircles') continue;
        if (!fromProfile.has(message.num)) fromProfile.set(message.num, new Set());
        fromProfile.get(message.num)!.add(field.num);
      }
    }

    expect(new Map([...POSITION_FIELDS].map(([m, f]) => [m, [...f].sort()]))).toEqual(
      new Map([...fromProfile].map(([m, f]) => [m, [...f].sort()])),
    );
  });

  it.each([
    ['position_lat', true],
    ['gpsLongitude', true],
    ['Lat', true],
    ['start_location', true],
    ['gps_position', true],
    ['saddle_position', false],
    ['pedal_position', false],
    ['gps_accuracy', false],
    ['latency', false],
    ['platform_height', false],
  ])('when a developer field is named %s, then it is a position: %s', (name, expected) => {
    expect(isPositionDeveloperField({ name, units: '', nativeMessageNumber: null, nativeFieldNumber: null })).toBe(expected);
  });

  it('when a developer field maps onto a native coordinate or is in semicircles, then it is a position whatever its name', () => {
    expect(isPositionDeveloperField({ name: 'x', units: '', nativeMessageNumber: 19, nativeFieldNumber: 27 })).toBe(true);
    expect(isPositionDeveloperField({ name: 'x', units: 'semicircles', nativeMessageNumber: null, nativeFieldNumber: null })).toBe(true);
    expect(isPositionDeveloperField({ name: 'x', units: 'W', nativeMessageNumber: 20, nativeFieldNumber: 7 })).toBe(false);
  });
});
