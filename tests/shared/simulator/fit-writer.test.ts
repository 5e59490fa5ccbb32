import { describe, expect, it } from 'vitest';
import { DEVELOPMENT_MANUFACTURER_ID, encodeActivityFit, FIT_EPOCH_UNIX_SECONDS, toFitTime } from '@shared/simulator/fit-writer';
import { recordWithMeter } from '@shared/simulator/meter';
import { simulateRide } from '@shared/simulator/ride';
import { decodeWithSdk } from './decode-with-sdk';

const START = Date.UTC(2024, 5, 1, 7) / 1000;
const ride = simulateRide({ seed: 31, durationSeconds: 1800, startTime: START, profile: 'race' });
const headUnit = { productId: 12, serialNumber: 40_001, softwareVersion: 4.25, productName: 'Test head unit' };

describe('encodeActivityFit', () => {
  it('when a dual-meter recording is written, then the SDK decoder reads back the same records with no integrity error', () => {
    const recording = recordWithMeter(ride, { position: 'dual', powerDropoutsPerHour: 4 }, 2);

    const decoded = decodeWithSdk(encodeActivityFit(recording, headUnit));

    expect(decoded.integrity).toBe(true);
    expect(decoded.errors).toEqual([]);
    expect(decoded.timestamps).toEqual(Array.from(recording.timestamps));
    expect(decoded.power).toEqual(Array.from(recording.power));
    expect(decoded.cadence).toEqual(Array.from(recording.cadence));
    expect(decoded.balance).toEqual(Array.from(recording.balance!, (byte) => (byte === 0xff ? undefined : byte)));
  });

  it('when a change-only recording is written, then the irregular timestamps survive the round trip', () => {
    const recording = recordWithMeter(ride, { position: 'left', recordingMode: 'change-only', smoothingSeconds: 3 }, 4);

    const decoded = decodeWithSdk(encodeActivityFit(recording, headUnit));

    expect(decoded.timestamps).toEqual(Array.from(recording.timestamps));
    expect(decoded.balance.every((value) => value === undefined)).toBe(true);
  });

  it('when a timestamp is converted, then Unix = FIT + 631065600 (FIT SDK profile)', () => {
    expect(FIT_EPOCH_UNIX_SECONDS).toBe(631065600);
    // The FIT epoch itself, 1989-12-31T00:00:00Z, is FIT time 0.
    expect(toFitTime(Date.UTC(1989, 11, 31) / 1000)).toBe(0);
  });

  it('when the file is written, then file_id and device_info name the development manufacturer and our device', () => {
    const recording = recordWithMeter(ride, { position: 'total' }, 1);
    const sensor = { productId: 7, serialNumber: 99, softwareVersion: 2.1, productName: 'Test spider' };

    const { messages } = decodeWithSdk(encodeActivityFit(recording, headUnit, { sensor }));

    expect(messages.fileIdMesgs[0]).toMatchObject({
      type: 4,
      manufacturer: DEVELOPMENT_MANUFACTURER_ID,
      product: 12,
      serialNumber: 40_001,
    });
    expect(messages.deviceInfoMesgs).toHaveLength(2);
    expect(messages.deviceInfoMesgs[0]).toMatchObject({ deviceIndex: 0, softwareVersion: 4.25, productName: 'Test head unit' });
    expect(messages.deviceInfoMesgs[1]).toMatchObject({ deviceIndex: 1, antplusDeviceType: 11, product: 7, softwareVersion: 2.1 });
  });

  it('when the file is written, then it closes with a lap, a session and an activity spanning the recording', () => {
    const recording = recordWithMeter(ride, { position: 'total' }, 1);

    const { messages } = decodeWithSdk(encodeActivityFit(recording, headUnit));

    expect(messages.lapMesgs).toHaveLength(1);
    expect(messages.sessionMesgs[0]).toMatchObject({ sport: 2, totalElapsedTime: 1799, numLaps: 1 });
    expect(messages.activityMesgs[0]).toMatchObject({ numSessions: 1 });
  });

  it('when location is asked for, then records carry a track; otherwise they carry none', () => {
    const recording = recordWithMeter(ride, { position: 'total' }, 1);

    const withTrack = decodeWithSdk(encodeActivityFit(recording, headUnit, { includeLocation: true }));
    const withoutTrack = decodeWithSdk(encodeActivityFit(recording, headUnit));

    expect(withTrack.messages.recordMesgs.every((record) => typeof record.positionLat === 'number')).toBe(true);
    expect(withoutTrack.messages.recordMesgs.some((record) => 'positionLat' in record)).toBe(false);
  });
});
