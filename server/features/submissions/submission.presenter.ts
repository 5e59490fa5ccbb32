import type { DeviceIdentity, DeviceInfo } from '@shared/analysis/types';
import { dayOf } from '@shared/schemas/day';
import { type DeviceInfoView, type MySubmissionView, rideComparisonView, type SubmissionView } from '@shared/schemas/submission-view';
import type { SubmissionStatus } from '@shared/schemas/submission';
import type { RiderSubmissionRow, SubmissionRow } from './submissions.repository';

export interface Viewer {
  id: number;
  roles: readonly string[];
}

const isCurator = (viewer: Viewer | undefined) => !!viewer && (viewer.roles.includes('moderator') || viewer.roles.includes('admin'));

/** Before acceptance only the rider, moderators and admins see a submission; after it, everybody. */
export function canSeeSubmission(viewer: Viewer | undefined, submission: { riderId: number | null; status: SubmissionStatus }) {
  if (submission.status === 'accepted') return true;
  return !!viewer && (viewer.id === submission.riderId || isCurator(viewer));
}

/**
 * A submission for one viewer, field by field. Everybody gets the tags, the
 * figures and days; the rider, moderators and admins also get what the files
 * say about the devices (makes and software, never serial numbers). Nobody gets
 * file hashes or clock times from this response.
 */
export function presentSubmission(row: SubmissionRow, viewer: Viewer | undefined): SubmissionView {
  const privileged = !!viewer && (viewer.id === row.riderId || isCurator(viewer));
  return {
    id: row.id,
    status: row.status,
    indoor: row.indoor,
    surface: row.surface,
    notes: row.notes,
    rideDate: row.rideStartedAt ? dayOf(row.rideStartedAt) : null,
    submittedOn: dayOf(row.createdAt),
    analysedOn: row.analysedAt ? dayOf(row.analysedAt) : null,
    version: row.version,
    result: row.result ? rideComparisonView.parse(row.result) : null,
    flags: row.flags.map(({ code, severity, message }) => ({ code, severity, message })),
    errorCode: row.errorCode,
    errorMessage: row.errorMessage,
    rider:
      row.riderId === null ? { handle: null, name: 'deleted rider' } : { handle: row.riderHandle, name: row.riderName ?? 'deleted rider' },
    isOwn: !!viewer && viewer.id === row.riderId,
    recordings: row.recordings.map((r) => ({
      side: r.side,
      position: r.position,
      makerName: r.makerName,
      makerSlug: r.makerSlug,
      modelId: r.modelId,
      modelName: r.modelName,
      modelSlug: r.modelSlug,
      modelKind: r.modelKind,
      firmwareId: r.firmwareId,
      firmwareVersion: r.firmwareVersion,
      recordingDeviceId: r.recordingDeviceId,
      recordingDeviceName: r.recordingDeviceName,
      recordingDeviceFirmware: r.recordingDeviceFirmware,
      recordingMode: r.recordingMode,
      zeroOffset: r.zeroOffset,
      otherMetersOn: r.otherMetersOn,
      ...(privileged && { deviceInfo: presentDeviceInfo(r.deviceInfo) }),
    })),
  };
}

export function presentDeviceInfo(info: DeviceInfo | null): DeviceInfoView {
  const identity = (d: DeviceIdentity | null | undefined) => ({
    manufacturerId: d?.manufacturerId ?? null,
    productId: d?.productId ?? null,
    softwareVersion: d?.softwareVersion ?? null,
  });
  return { creator: identity(info?.creator), powerMeter: info?.powerMeter ? identity(info.powerMeter) : null };
}

/** One line of the rider's own list. */
export function presentMySubmission(row: RiderSubmissionRow): MySubmissionView {
  return {
    id: row.id,
    status: row.status,
    submittedOn: dayOf(row.createdAt),
    biasPercent: row.biasPercent,
    flags: (row.flags ?? []).map(({ code, severity, message }) => ({ code, severity, message })),
    recordings: (row.recordings ?? []).map((r) => ({ side: r.side, model: r.model, firmware: r.firmware })),
  };
}
