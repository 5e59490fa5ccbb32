import { Encoder, Profile } from '@garmin/fitsdk';
import { describe, expect, it } from 'vitest';
import { createFitEncoder, FIELDS, fitCrc } from '@shared/simulator/fit-encoder';
import { activityMessages } from '@shared/simulator/fit-writer';
import { recordWithMeter } from '@shared/simulator/meter';
import { simulateRide } from '@shared/simulator/ride';

const ascii = (text: string) => new TextEncoder().encode(text);

describe('FIT encoder', () => {
  it('when the CRC of "123456789" is computed, then it is 0xBB3D (CRC-16/ARC check value, CRC catalogue)', () => {
    expect(fitCrc(ascii('123456789'))).toBe(0xbb3d);
  });

  it('when the header CRC of the FIT SDK README examples is computed, then it matches the bytes they carry', () => {
    // @garmin/fitsdk README: "0E 10 D9 07 00 00 00 00 2E 46 49 54 | 91 33" and "0E 10 43 08 78 06 09 00 2E 46 49 54 | 96 85".
    expect(fitCrc(new Uint8Array([0x0e, 0x10, 0xd9, 0x07, 0, 0, 0, 0, 0x2e, 0x46, 0x49, 0x54]))).toBe(0x3391);
    expect(fitCrc(new Uint8Array([0x0e, 0x10, 0x43, 0x08, 0x78, 0x06, 0x09, 0x00, 0x2e, 0x46, 0x49, 0x54]))).toBe(0x8596);
  });

  it('when our field table is compared with the SDK profile, then numbers, base types and scales agree', () => {
    for (const [mesgNum, fields] of Object.entries(FIELDS)) {
      const profileFields = Object.values(Profile.messages[Number(mesgNum)].fields) as Array<{ name: string; num: number; baseType: string; scale: number }>;
      for (const [name, spec] of Object.entries(fields)) {
        const profileField = profileFields.find((field) => field.name === name);
        expect(profileField, `${mesgNum}.${name}`).toBeDefined();
        expect([name, spec.num, spec.baseType, spec.scale ?? 1]).toEqual([name, profileField!.num, profileField!.baseType, profileField!.scale]);
      }
    }
  });

  it('when an activity is written by our encoder and by the SDK Encoder, then the data between header and CRC is identical', () => {
    const ride = simulateRide({ seed: 5, durationSeconds: 1200, startTime: Date.UTC(2024, 5, 1) / 1000, profile: 'race' });
    const recording = recordWithMeter(ride, { position: 'dual', recordingMode: 'change-only', powerDropoutsPerHour: 6 }, 3);
    const messages = activityMessages(
      recording,
      { productId: 3, serialNumber: 77, softwareVersion: 1.5, productName: 'Tëst unit' },
      { includeLocation: true, sensor: { productId: 4, serialNumber: 78, softwareVersion: 2 } },
    );

    const ours = createFitEncoder();
    const sdk = new Encoder();
    for (const [mesgNum, message] of messages) {
      ours.write(mesgNum, message);
      sdk.onMesg(mesgNum, message);
    }
    const ourBytes = ours.close();
    const sdkBytes = sdk.close();

    expect(ourBytes.length).toBe(sdkBytes.length);
    expect(Buffer.from(ourBytes.subarray(14, -2)).equals(Buffer.from(sdkBytes.subarray(14, -2)))).toBe(true);
  });

  it('when a file is closed, then the header says protocol 2.0, the data size and ".FIT", and both CRCs check', () => {
    const encoder = createFitEncoder();
    encoder.write(0, { type: 4, manufacturer: 255, product: 1, serialNumber: 5, timeCreated: 1_000_000_000 });

    const bytes = encoder.close();
    const view = new DataView(bytes.buffer);

    expect(bytes[0]).toBe(14);
    expect(bytes[1]).toBe(0x20);
    expect(view.getUint32(4, true)).toBe(bytes.length - 16);
    expect(new TextDecoder().decode(bytes.subarray(8, 12))).toBe('.FIT');
    expect(view.getUint16(12, true)).toBe(fitCrc(bytes, 0, 12));
    expect(fitCrc(bytes)).toBe(0); // a CRC over data plus its own little-endian CRC is zero
  });
});
