// Writes a meter recording as a FIT activity file: what a head unit would hand a
// rider after the ride, with the meter as a connected sensor. The bytes come from
// @garmin/fitsdk's Encoder, the FIT SDK's own writer, so the decoder is tested
// against files it did not write itself.
import { Encoder, Profile } from '@garmin/fitsdk';
import { INVALID_BALANCE, type MeterRecording } from './meter';

/** FIT time counts seconds from 1989-12-31T00:00:00Z: Unix = FIT + 631065600 (FIT SDK profile). */
export const FIT_EPOCH_UNIX_SECONDS = 631065600;

/** FIT manufacturer id reserved for development; every file we make uses it. */
export const DEVELOPMENT_MANUFACTURER_ID = 255;

// Enum values from the FIT SDK profile (types file, event, event_type, lap_trigger,
// session_trigger, sport, sub_sport, activity, source_type, antplus_device_type).
const FILE_ACTIVITY = 4;
const EVENT = { timer: 0, session: 8, lap: 9, activity: 26 } as const;
const EVENT_TYPE = { start: 0, stop: 1, stopAll: 4 } as const;
const LAP_TRIGGER_SESSION_END = 7;
const SESSION_TRIGGER_ACTIVITY_END = 0;
const SPORT_CYCLING = 2;
const SUB_SPORT = { road: 7, indoorCycling: 6 } as const;
const ACTIVITY_MANUAL = 0;
const SOURCE_TYPE_ANTPLUS = 1;
const ANTPLUS_BIKE_POWER = 11;

export interface DeviceIdentity {
  manufacturerId?: number;
  productId: number;
  serialNumber: number;
  /** e.g. 3.2; FIT stores it in hundredths. */
  softwareVersion: number;
  productName?: string;
}

export interface FitWriterOptions {
  /** The power meter as a connected sensor (a second device_info message). */
  sensor?: DeviceIdentity;
  /** Adds a made-up GPS track, so tests can check that the decoder strips location. */
  includeLocation?: boolean;
  /** Indoor rides are written with the indoor-cycling sub-sport. */
  indoor?: boolean;
  /** The head unit's thermometer: °C at the first record, changing linearly by the hour (FIT record temperature, whole °C). */
  temperature?: { startCelsius: number; changePerHour?: number };
  /** The sensor's battery as it reports it during the ride (device_info of the sensor; needs `sensor`). */
  sensorBattery?: { atFraction: number; status: number; volts: number }[];
}

/** One message as the SDK's Encoder takes it: field names of the FIT profile, values already in units (scales applied by the SDK). */
export type FitMessage = Record<string, number | string | undefined>;
export type FitMessageList = Array<[mesgNum: number, message: FitMessage]>;

/** Global message numbers (FIT SDK profile, MesgNum). */
export const MESG_NUM = {
  fileId: Profile.MesgNum.FILE_ID,
  session: Profile.MesgNum.SESSION,
  lap: Profile.MesgNum.LAP,
  record: Profile.MesgNum.RECORD,
  event: Profile.MesgNum.EVENT,
  deviceInfo: Profile.MesgNum.DEVICE_INFO,
  activity: Profile.MesgNum.ACTIVITY,
} as const;

type SdkMesg = Parameters<Encoder['onMesg']>[1];

// An open-sea point (mid South Atlantic): the made-up track names no real place.
const TRACK_START_DEGREES = { lat: -30.5, long: -20.25 };
const SEMICIRCLES_PER_DEGREE = 2 ** 31 / 180;
const METRES_PER_DEGREE_LAT = 111_320;

export function toFitTime(unixSeconds: number): number {
  return Math.round(unixSeconds) - FIT_EPOCH_UNIX_SECONDS;
}

/** `recording` = what the meter's recording device wrote; `device` = that recording device. */
export function encodeActivityFit(recording: MeterRecording, device: DeviceIdentity, options: FitWriterOptions = {}): Uint8Array {
  const encoder = new Encoder();
  // Plain objects: the SDK's message types do not list every field by name.
  for (const [mesgNum, message] of activityMessages(recording, device, options)) encoder.onMesg(mesgNum, message as SdkMesg);
  return encoder.close();
}

/** The messages of the activity file, in file order. */
export function activityMessages(recording: MeterRecording, device: DeviceIdentity, options: FitWriterOptions = {}): FitMessageList {
  const count = recording.timestamps.length;
  if (count === 0) throw new RangeError('a recording needs at least one record');
  const start = toFitTime(recording.timestamps[0]);
  const end = toFitTime(recording.timestamps[count - 1]);
  const messages: FitMessageList = [];

  messages.push([
    MESG_NUM.fileId,
    {
      type: FILE_ACTIVITY,
      manufacturer: device.manufacturerId ?? DEVELOPMENT_MANUFACTURER_ID,
      product: device.productId,
      serialNumber: device.serialNumber,
      timeCreated: start,
      productName: device.productName,
    },
  ]);
  messages.push([MESG_NUM.deviceInfo, deviceInfo(device, 0, start)]);
  if (options.sensor) {
    messages.push([
      MESG_NUM.deviceInfo,
      { ...deviceInfo(options.sensor, 1, start), deviceType: ANTPLUS_BIKE_POWER, sourceType: SOURCE_TYPE_ANTPLUS },
    ]);
  }
  messages.push([MESG_NUM.event, { timestamp: start, event: EVENT.timer, eventType: EVENT_TYPE.start }]);

  const track = options.includeLocation ? madeUpTrack(recording) : null;
  for (let i = 0; i < count; i += 1) {
    const balance = recording.balance?.[i];
    messages.push([
      MESG_NUM.record,
      {
        timestamp: toFitTime(recording.timestamps[i]),
        positionLat: track?.lat[i],
        positionLong: track?.long[i],
        power: recording.power[i],
        cadence: recording.cadence[i],
        leftRightBalance: balance === undefined || balance === INVALID_BALANCE ? undefined : balance,
        temperature:
          options.temperature &&
          Math.round(
            options.temperature.startCelsius +
              ((options.temperature.changePerHour ?? 0) * (recording.timestamps[i] - recording.timestamps[0])) / 3600,
          ),
      },
    ]);
    for (const report of batteryAt(options, i, count)) {
      messages.push([
        MESG_NUM.deviceInfo,
        {
          ...deviceInfo(options.sensor!, 1, toFitTime(recording.timestamps[i])),
          deviceType: ANTPLUS_BIKE_POWER,
          sourceType: SOURCE_TYPE_ANTPLUS,
          batteryStatus: report.status,
          batteryVoltage: report.volts,
        },
      ]);
    }
  }

  messages.push([MESG_NUM.event, { timestamp: end, event: EVENT.timer, eventType: EVENT_TYPE.stopAll }]);
  const elapsed = end - start;
  const summary = summarise(recording);
  const sport = { sport: SPORT_CYCLING, subSport: options.indoor ? SUB_SPORT.indoorCycling : SUB_SPORT.road };
  const times = { timestamp: end, startTime: start, totalElapsedTime: elapsed, totalTimerTime: elapsed };
  messages.push([
    MESG_NUM.lap,
    { ...times, event: EVENT.lap, eventType: EVENT_TYPE.stop, lapTrigger: LAP_TRIGGER_SESSION_END, messageIndex: 0, ...sport, ...summary },
  ]);
  messages.push([
    MESG_NUM.session,
    {
      ...times,
      event: EVENT.session,
      eventType: EVENT_TYPE.stop,
      trigger: SESSION_TRIGGER_ACTIVITY_END,
      firstLapIndex: 0,
      numLaps: 1,
      messageIndex: 0,
      ...sport,
      ...summary,
    },
  ]);
  messages.push([
    MESG_NUM.activity,
    { timestamp: end, totalTimerTime: elapsed, numSessions: 1, type: ACTIVITY_MANUAL, event: EVENT.activity, eventType: EVENT_TYPE.stop },
  ]);
  return messages;
}

/** The battery reports due at record i: each at its fraction of the recording. */
function batteryAt(options: FitWriterOptions, i: number, count: number) {
  if (!options.sensor || !options.sensorBattery) return [];
  return options.sensorBattery.filter((report) => Math.min(count - 1, Math.floor(report.atFraction * count)) === i);
}

function deviceInfo(device: DeviceIdentity, deviceIndex: number, timestamp: number) {
  return {
    timestamp,
    deviceIndex,
    manufacturer: device.manufacturerId ?? DEVELOPMENT_MANUFACTURER_ID,
    product: device.productId,
    serialNumber: device.serialNumber,
    softwareVersion: device.softwareVersion,
    productName: device.productName,
  };
}

function summarise(recording: MeterRecording) {
  let powerSum = 0;
  let maxPower = 0;
  let cadenceSum = 0;
  let pedalled = 0;
  let maxCadence = 0;
  for (let i = 0; i < recording.power.length; i += 1) {
    powerSum += recording.power[i];
    maxPower = Math.max(maxPower, recording.power[i]);
    if (recording.cadence[i] > 0) {
      cadenceSum += recording.cadence[i];
      pedalled += 1;
      maxCadence = Math.max(maxCadence, recording.cadence[i]);
    }
  }
  return {
    avgPower: Math.round(powerSum / recording.power.length),
    maxPower,
    avgCadence: pedalled > 0 ? Math.round(cadenceSum / pedalled) : 0,
    maxCadence,
  };
}

/**
 * A plausible track for the location test: speed rises with the cube root of
 * power (air drag dominates on the flat; CdA 0.32 m², air 1.2 kg/m³, a rough
 * common-practice figure), heading wanders slowly.
 */
function madeUpTrack(recording: MeterRecording): { lat: Int32Array; long: Int32Array } {
  const count = recording.timestamps.length;
  const lat = new Int32Array(count);
  const long = new Int32Array(count);
  let latDegrees = TRACK_START_DEGREES.lat;
  let longDegrees = TRACK_START_DEGREES.long;
  for (let i = 0; i < count; i += 1) {
    const seconds = i === 0 ? 0 : recording.timestamps[i] - recording.timestamps[i - 1];
    const metres = Math.cbrt(recording.power[i] / (0.5 * 1.2 * 0.32)) * seconds;
    const heading = 0.8 * Math.sin(recording.timestamps[i] / 900);
    latDegrees += (metres * Math.cos(heading)) / METRES_PER_DEGREE_LAT;
    longDegrees += (metres * Math.sin(heading)) / (METRES_PER_DEGREE_LAT * Math.cos((latDegrees * Math.PI) / 180));
    lat[i] = Math.round(latDegrees * SEMICIRCLES_PER_DEGREE);
    long[i] = Math.round(longDegrees * SEMICIRCLES_PER_DEGREE);
  }
  return { lat, long };
}
