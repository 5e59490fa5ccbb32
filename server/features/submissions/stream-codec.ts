import { gunzipSync, gzipSync } from 'node:zlib';
import type { RideStream } from '@shared/analysis/types';
import { storedDeviceInfo } from './stored-ride-facts';

// What we keep of an uploaded file: the normalised stream the engine needs, as
// gzip'd typed arrays. Never the original file, never location, never a serial number.
// Layout: u32 header length, JSON header (device, recording statistics, count, and
// from version 2 the power meter's battery reports and whether temperature follows),
// then Float64 timestamps and Float32 power, cadence, balance (and temperature).
export function encodeStream(stream: RideStream): Buffer {
  const count = stream.timestamps.length;
  const temperature = stream.temperatureCelsius;
  const header = Buffer.from(
    JSON.stringify({
      v: 2,
      count,
      device: storedDeviceInfo(stream.device),
      recording: stream.recording,
      powerMeterReports: stream.powerMeterReports ?? [],
      temperature: temperature !== undefined,
    }),
  );
  const columns = [stream.powerWatts, stream.cadenceRpm, stream.rightBalancePercent, ...(temperature ? [temperature] : [])];
  const body = Buffer.alloc(4 + header.length + count * (8 + 4 * columns.length));
  body.writeUInt32LE(header.length, 0);
  header.copy(body, 4);
  let offset = 4 + header.length;
  for (let i = 0; i < count; i++, offset += 8) body.writeDoubleLE(stream.timestamps[i], offset);
  for (const values of columns) {
    for (let i = 0; i < count; i++, offset += 4) body.writeFloatLE(values[i], offset);
  }
  return gzipSync(body, { level: 6 });
}

export function decodeStream(stored: Buffer): RideStream {
  const body = gunzipSync(stored);
  const headerLength = body.readUInt32LE(0);
  const header = JSON.parse(body.subarray(4, 4 + headerLength).toString('utf8'));
  const count: number = header.count;
  let offset = 4 + headerLength;
  const timestamps = new Float64Array(count);
  for (let i = 0; i < count; i++, offset += 8) timestamps[i] = body.readDoubleLE(offset);
  const column = () => {
    const values = new Float32Array(count);
    for (let i = 0; i < count; i++, offset += 4) values[i] = body.readFloatLE(offset);
    return values;
  };
  const [powerWatts, cadenceRpm, rightBalancePercent] = [column(), column(), column()];
  const temperatureCelsius = header.temperature ? column() : undefined;
  return {
    timestamps,
    powerWatts,
    cadenceRpm,
    rightBalancePercent,
    ...(temperatureCelsius && { temperatureCelsius }),
    device: header.device,
    powerMeterReports: header.powerMeterReports ?? [],
    recording: header.recording,
  };
}
