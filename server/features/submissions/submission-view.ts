import type { SubmissionStatus } from '@shared/schemas/submission';

interface Viewer {
  id: number;
  roles: string[];
}

/** Before acceptance only the rider, moderators and admins see a submission; after it, everybody. */
export function canSeeSubmission(viewer: Viewer | undefined, submission: { riderId: number | null; status: SubmissionStatus }) {
  if (submission.status === 'accepted') return true;
  if (!viewer) return false;
  return viewer.id === submission.riderId || viewer.roles.includes('moderator') || viewer.roles.includes('admin');
}

// What the API shows of a submission. Device serial numbers stay with the rider
// and moderators; the public sees model, firmware and tags.
export function toSubmissionView<T extends { riderId: number | null; riderHandle?: string | null; riderName?: string | null; recordings: Array<{ deviceInfo?: unknown }> }>(
  submission: T,
  viewer: Viewer | undefined,
) {
  const privileged = viewer && (viewer.id === submission.riderId || viewer.roles.includes('moderator') || viewer.roles.includes('admin'));
  const { riderId, riderHandle, riderName, recordings, ...rest } = submission;
  return {
    ...rest,
    // Next to a handle, the exact start of a ride says where someone was when: the public gets the day only.
    ...('rideStartedAt' in rest && !privileged && { rideStartedAt: dayOnly(rest.rideStartedAt) }),
    rider: riderId === null ? { handle: null, name: 'deleted rider' } : { handle: riderHandle ?? null, name: riderName ?? 'deleted rider' },
    isOwn: viewer?.id === riderId,
    recordings: recordings.map(({ deviceInfo, ...r }) => (privileged ? { ...r, deviceInfo } : r)),
  };
}

function dayOnly(value: unknown): string | null {
  const date = value instanceof Date ? value : typeof value === 'string' ? new Date(value) : null;
  return date && !Number.isNaN(date.getTime()) ? date.toISOString().slice(0, 10) : null;
}
