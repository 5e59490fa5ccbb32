import type { ComparisonResult, DeviceIdentity, DeviceInfo, RecordingStatistics } from '@shared/analysis/types';

// What we keep of a ride's facts, each in one place. No role needs a device's
// serial number, so it is never stored; a recording's clock times live in the
// stream (the engine needs them) and, to the second, only in the submission's
// ride_started_at/ride_ended_at columns that moderators' overlap check reads.

/** A file's device identity without the serial number. */
export function storedDeviceIdentity(device: DeviceIdentity): DeviceIdentity {
  return {
    manufacturerId: device.manufacturerId,
    productId: device.productId,
    serialNumber: null,
    softwareVersion: device.softwareVersion,
  };
}

export function storedDeviceInfo(info: DeviceInfo): DeviceInfo {
  return { creator: storedDeviceIdentity(info.creator), powerMeter: info.powerMeter ? storedDeviceIdentity(info.powerMeter) : null };
}

/** A recording's statistics without its clock times. */
export type StoredRecordingStats = Omit<RecordingStatistics, 'startTime' | 'endTime'> & { durationSeconds: number };

export function storedRecordingStats(stats: RecordingStatistics): StoredRecordingStats {
  return {
    recordCount: stats.recordCount,
    durationSeconds: stats.endTime - stats.startTime,
    medianIntervalSeconds: stats.medianIntervalSeconds,
    longGapCount: stats.longGapCount,
    longGapSeconds: stats.longGapSeconds,
  };
}

/**
 * The comparison as stored in `submissions.result`: the devices live in the
 * recordings' device_info and the recording statistics in recording_stats, and
 * the alignment keeps its offset, overlap and correlation but not its clock times.
 */
export type StoredComparison = Omit<ComparisonResult, 'devices' | 'recordings' | 'alignment'> & {
  alignment: Omit<ComparisonResult['alignment'], 'startTime' | 'endTime'>;
};

export function storedResult(result: ComparisonResult): StoredComparison {
  const { devices: _devices, recordings: _recordings, alignment, ...rest } = result;
  return {
    ...rest,
    alignment: {
      clockOffsetSeconds: alignment.clockOffsetSeconds,
      overlapSeconds: alignment.overlapSeconds,
      correlation: alignment.correlation,
    },
  };
}
