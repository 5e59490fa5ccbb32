// The rider's tags of one recording against what the file itself says about its
// devices: the power meter's firmware (FIT device_info of the bike-power sensor)
// and the unit that wrote the file (file_id / device_info of the creator). Pure:
// the upload form uses it to pre-fill and warn, the analysis job to raise a flag.
import type { DeviceIdentity, DeviceInfo, QualityFlag, Side } from './types';

/** What the catalogue offers for one recording's tags: the tagged model's firmware versions and the recording devices. */
export interface TagCatalogue {
  firmware: readonly { id: number; version: string }[];
  recordingDevices: readonly { id: number; name: string }[];
}

/** The rider's tags, as ids into the catalogue plus the free-text recording-device firmware. */
export interface RecordingTagsForCheck {
  firmwareId: number | null;
  recordingDeviceId: number | null;
  recordingDeviceFirmware?: string | null;
}

export type TagField = 'firmware' | 'recording_device' | 'recording_device_firmware';

export interface TagDisagreement {
  field: TagField;
  /** What the rider tagged (a catalogue version or name, or the free text). */
  tagged: string;
  /** What the file reports. */
  inFile: string;
}

export interface TagSuggestions {
  /** The catalogue firmware of the tagged model that matches the file's power meter; null when none does. */
  firmwareId: number | null;
  /** The file's power-meter firmware as text, for a proposal when the catalogue lacks it. */
  firmwareVersion: string | null;
  recordingDeviceId: number | null;
  recordingDeviceFirmware: string | null;
}

export interface TagCheck {
  disagreements: TagDisagreement[];
  suggestions: TagSuggestions;
}

/**
 * Compares one recording's tags with its file. A field the file does not report is
 * never a disagreement; versions are compared by their first two numbers at the FIT
 * resolution of 0.01 (software_version has scale 100), so "1.2", "1.20", "1.2.0" and 1.2
 * agree (as the review page's device checks read them).
 */
export function checkTags(device: DeviceInfo, tags: RecordingTagsForCheck, catalogue: TagCatalogue): TagCheck {
  const meterVersion = device.powerMeter?.softwareVersion ?? null;
  const creatorName = productNameOf(device.creator);
  const creatorVersion = device.creator.softwareVersion;

  const suggestions: TagSuggestions = {
    firmwareId: meterVersion === null ? null : (catalogue.firmware.find((f) => sameVersion(f.version, meterVersion))?.id ?? null),
    firmwareVersion: meterVersion === null ? null : formatVersion(meterVersion),
    recordingDeviceId: creatorName === null ? null : (catalogue.recordingDevices.find((d) => sameName(d.name, creatorName))?.id ?? null),
    recordingDeviceFirmware: creatorVersion === null ? null : formatVersion(creatorVersion),
  };

  const disagreements: TagDisagreement[] = [];
  const taggedFirmware = catalogue.firmware.find((f) => f.id === tags.firmwareId);
  if (meterVersion !== null && taggedFirmware && !sameVersion(taggedFirmware.version, meterVersion)) {
    disagreements.push({ field: 'firmware', tagged: taggedFirmware.version, inFile: formatVersion(meterVersion) });
  }
  const taggedDevice = catalogue.recordingDevices.find((d) => d.id === tags.recordingDeviceId);
  if (creatorName !== null && taggedDevice && !sameName(taggedDevice.name, creatorName)) {
    disagreements.push({ field: 'recording_device', tagged: taggedDevice.name, inFile: creatorName });
  }
  const taggedDeviceFirmware = tags.recordingDeviceFirmware?.trim() ?? '';
  if (creatorVersion !== null && taggedDeviceFirmware !== '' && !sameVersion(taggedDeviceFirmware, creatorVersion)) {
    disagreements.push({ field: 'recording_device_firmware', tagged: taggedDeviceFirmware, inFile: formatVersion(creatorVersion) });
  }
  return { disagreements, suggestions };
}

const SIDE_NAME: Record<Side, string> = { a: 'Device A', b: 'Device B' };

/** The quality flag a disagreement raises on the server (method version 2): code tag_mismatch, severe for firmware. */
export function tagMismatchFlags(side: Side, check: TagCheck): QualityFlag[] {
  return check.disagreements.map((d) => {
    const what =
      d.field === 'firmware' ? 'power meter firmware' : d.field === 'recording_device' ? 'recording device' : 'recording device firmware';
    return {
      code: d.field === 'firmware' ? 'firmware_tag_mismatch' : 'device_tag_mismatch',
      // A wrong firmware tag moves the ride into another version's figures; a wrong head unit only blurs the smoothing and dropout context.
      severity: d.field === 'firmware' ? 'severe' : 'warning',
      message: `${SIDE_NAME[side]}'s ${what} is tagged ${d.tagged}, but its file reports ${d.inFile}.`,
    } satisfies QualityFlag;
  });
}

/** FIT product_name when the decoder returns one (the complete device message carries it). */
function productNameOf(identity: DeviceIdentity): string | null {
  const name = (identity as DeviceIdentity & { productName?: string | null }).productName;
  return typeof name === 'string' && name.trim() !== '' ? name.trim() : null;
}

/** Hundredths of a version from its first two numbers: "1.2" → 120, "v4.75" → 475, "2.1.0" → 210; null for other text. */
export function versionHundredths(version: string | number): number | null {
  if (typeof version === 'number') return Number.isFinite(version) ? Math.round(version * 100) : null;
  const match = /^\s*v?(\d+)(?:\.(\d+))?(?:[.\-+][0-9a-z.\-+]*)?\s*$/i.exec(version);
  if (!match) return null;
  const value = Number(`${match[1]}.${match[2] ?? '0'}`);
  return Math.round(value * 100);
}

function sameVersion(tagged: string, inFile: number): boolean {
  const a = versionHundredths(tagged);
  // Text that is not a version at all is not contradicted by the file.
  return a === null || a === versionHundredths(inFile);
}

export function formatVersion(version: number): string {
  const hundredths = Math.round(version * 100);
  const whole = Math.floor(hundredths / 100);
  const rest = hundredths % 100;
  if (rest === 0) return `${whole}.0`;
  return rest % 10 === 0 ? `${whole}.${rest / 10}` : `${whole}.${String(rest).padStart(2, '0')}`;
}

function sameName(a: string, b: string): boolean {
  const norm = (s: string) =>
    s
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, ' ')
      .trim();
  return norm(a) === norm(b);
}
