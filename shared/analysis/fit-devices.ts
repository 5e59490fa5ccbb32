import { FIT_EPOCH_UNIX_SECONDS } from './fit-reader';
import type { FitDeviceMessage, FitMetaMessages } from './fit-meta-messages';
import type { DeviceIdentity, DeviceInfo, PowerMeterReport } from './types';

// Device identities from device_info messages. A device is usually described more
// than once (at the start, often before the sensor has sent its serial number or
// software version, and again at the end), so each device's identity is the latest
// valid value of each field across all its messages.

const CREATOR_DEVICE_INDEX = 0; // FIT SDK profile, device_index: creator

// FIT SDK profile: source_type, antplus_device_type, ble_device_type.
const SOURCE_ANTPLUS = 1;
const SOURCE_BLE = 3;
const ANTPLUS_BIKE_POWER = 11;
const BLE_BIKE_POWER = 2;

/** device_info battery_voltage has scale 256 (FIT SDK profile). */
const BATTERY_VOLTAGE_SCALE = 256;
/** device_info software_version has scale 100 (FIT SDK profile). */
const SOFTWARE_VERSION_SCALE = 100;

type DeviceField = Exclude<keyof FitDeviceMessage, 'fitTime'>;

export function deviceInfoFromMessages(meta: FitMetaMessages): { device: DeviceInfo; powerMeterReports: PowerMeterReport[] } {
  const groups = new Map<string, FitDeviceMessage[]>();
  for (const message of meta.devices) {
    const key = deviceKey(message);
    const group = groups.get(key);
    if (group) group.push(message);
    else groups.set(key, [message]);
  }
  const creatorGroup = groups.get(`index:${CREATOR_DEVICE_INDEX}`) ?? [];
  const powerGroup = [...groups.values()].find((group) => group.some(isPowerMeter)) ?? null;
  const creatorSoftware = latest(creatorGroup, 'softwareVersion');
  const device: DeviceInfo = {
    creator: {
      manufacturerId: optional(meta.creator?.manufacturer ?? NaN),
      productId: optional(meta.creator?.product ?? NaN),
      serialNumber: optional(meta.creator?.serialNumber ?? NaN),
      softwareVersion: optional(creatorSoftware / SOFTWARE_VERSION_SCALE),
    },
    powerMeter: powerGroup === null ? null : identity(powerGroup),
  };
  const powerMeterReports = (powerGroup ?? []).map((message) => ({
    time: optional(message.fitTime + FIT_EPOCH_UNIX_SECONDS),
    batteryStatus: optional(message.batteryStatus),
    batteryVolts: optional(message.batteryVoltage / BATTERY_VOLTAGE_SCALE),
    cumulativeOperatingSeconds: optional(message.cumOperatingTime),
  }));
  return { device, powerMeterReports };
}

function deviceKey(message: FitDeviceMessage): string {
  if (!Number.isNaN(message.deviceIndex)) return `index:${message.deviceIndex}`;
  if (!Number.isNaN(message.antDeviceNumber)) return `ant:${message.antDeviceNumber}`;
  if (!Number.isNaN(message.serialNumber)) return `serial:${message.serialNumber}`;
  return 'unknown';
}

function isPowerMeter(message: FitDeviceMessage): boolean {
  if (message.sourceType === SOURCE_BLE) return message.deviceType === BLE_BIKE_POWER;
  return (Number.isNaN(message.sourceType) || message.sourceType <= SOURCE_ANTPLUS) && message.deviceType === ANTPLUS_BIKE_POWER;
}

function identity(group: FitDeviceMessage[]): DeviceIdentity {
  return {
    manufacturerId: optional(latest(group, 'manufacturer')),
    productId: optional(latest(group, 'product')),
    serialNumber: optional(latest(group, 'serialNumber')),
    softwareVersion: optional(latest(group, 'softwareVersion') / SOFTWARE_VERSION_SCALE),
  };
}

/** The last valid value of a field across the device's messages, in file order. */
function latest(group: FitDeviceMessage[], field: DeviceField): number {
  for (let i = group.length - 1; i >= 0; i--) if (!Number.isNaN(group[i][field])) return group[i][field];
  return NaN;
}

function optional(value: number): number | null {
  return Number.isNaN(value) ? null : value;
}
