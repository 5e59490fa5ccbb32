import { describe, expect, it } from 'vitest';
import { checkTags, formatVersion, tagMismatchFlags, versionHundredths } from '@shared/analysis/tag-check';
import type { DeviceIdentity, DeviceInfo } from '@shared/analysis/types';

const catalogue = {
  firmware: [
    { id: 11, version: '1.2' },
    { id: 12, version: '2.2' },
    { id: 13, version: '4.75' },
  ],
  recordingDevices: [
    { id: 21, name: 'Larkspur Trail 40' },
    { id: 22, name: 'Orrin Loop' },
  ],
};

function identity(softwareVersion: number | null, productName?: string): DeviceIdentity & { productName?: string } {
  return { manufacturerId: 255, productId: 7, serialNumber: 1234, softwareVersion, ...(productName ? { productName } : {}) };
}

function device(meterVersion: number | null, creator = identity(3.1, 'Larkspur Trail 40')): DeviceInfo {
  return { creator, powerMeter: meterVersion === null ? null : identity(meterVersion) };
}

describe('tag check', () => {
  it('when demo pair 01 is tagged firmware 2.2 while its file reports 1.2, then the firmware disagrees and 1.2 is suggested', () => {
    // Arrange
    const tags = { firmwareId: 12, recordingDeviceId: 21, recordingDeviceFirmware: '3.1' };

    // Act
    const check = checkTags(device(1.2), tags, catalogue);

    // Assert
    expect(check.disagreements).toEqual([{ field: 'firmware', tagged: '2.2', inFile: '1.2' }]);
    expect(check.suggestions).toMatchObject({
      firmwareId: 11,
      firmwareVersion: '1.2',
      recordingDeviceId: 21,
      recordingDeviceFirmware: '3.1',
    });
  });

  it('when the tags match the file, then there is no disagreement', () => {
    const check = checkTags(device(4.75), { firmwareId: 13, recordingDeviceId: 21, recordingDeviceFirmware: '3.10' }, catalogue);

    expect(check.disagreements).toEqual([]);
  });

  it('when the file names another recording device with another firmware, then both disagree and the catalogue entry is suggested', () => {
    const check = checkTags(
      device(1.2, identity(5.02, 'orrin loop')),
      { firmwareId: 11, recordingDeviceId: 21, recordingDeviceFirmware: '3.1' },
      catalogue,
    );

    expect(check.disagreements.map((d) => d.field)).toEqual(['recording_device', 'recording_device_firmware']);
    expect(check.suggestions.recordingDeviceId).toBe(22);
    expect(check.suggestions.recordingDeviceFirmware).toBe('5.02');
  });

  it('when the file lists no power meter, then the firmware tag is never contradicted', () => {
    const check = checkTags(device(null), { firmwareId: 12, recordingDeviceId: 21 }, catalogue);

    expect(check.disagreements).toEqual([]);
    expect(check.suggestions.firmwareId).toBeNull();
  });

  it('when the file reports a version the catalogue lacks, then no id is suggested but the version text is', () => {
    const check = checkTags(device(65.53), { firmwareId: 11, recordingDeviceId: null }, catalogue);

    expect(check.suggestions).toMatchObject({ firmwareId: null, firmwareVersion: '65.53' });
    expect(check.disagreements).toEqual([{ field: 'firmware', tagged: '1.2', inFile: '65.53' }]);
  });

  it('when a firmware disagrees, then the server raises a severe firmware_tag_mismatch flag naming the side', () => {
    const check = checkTags(device(1.2), { firmwareId: 12, recordingDeviceId: 21 }, catalogue);

    const flags = tagMismatchFlags('a', check);

    expect(flags).toEqual([
      {
        code: 'firmware_tag_mismatch',
        severity: 'severe',
        message: "Device A's power meter firmware is tagged 2.2, but its file reports 1.2.",
      },
    ]);
  });

  it('when versions are written differently, then they compare at the FIT resolution of 0.01', () => {
    expect(versionHundredths('1.20')).toBe(120);
    expect(versionHundredths('v4.75')).toBe(475);
    expect(versionHundredths(1.2)).toBe(120);
    expect(versionHundredths('2.3.1')).toBe(230);
    expect(versionHundredths('beta')).toBeNull();
    expect(formatVersion(1.05)).toBe('1.05');
    expect(formatVersion(2)).toBe('2.0');
  });
});
