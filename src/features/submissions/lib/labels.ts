import type { FlagSeverity, LikeForLikeMode, MeasurementPosition, Side } from '@shared/analysis/types';
import type { SubmissionStatus } from '@shared/schemas/submission';

export const SIDE_NAMES: Record<Side, string> = { a: 'A, the meter judged', b: 'B, its partner' };

export const POSITION_LABELS: Record<MeasurementPosition, string> = {
  left: 'Left leg',
  right: 'Right leg',
  dual: 'Both legs, measured apart',
  total: 'Total (both legs together)',
};

export const RECORDING_MODE_LABELS = { every_second: 'Every second', change_only: 'Only on change (smart recording)' } as const;
export const ZERO_OFFSET_LABELS = { yes: 'Yes', no: 'No', unsure: 'Not sure' } as const;
export const RECORDING_DEVICE_KIND_LABELS = { head_unit: 'Head unit', watch: 'Watch', app: 'App' } as const;

export const STATUS_LABELS: Record<SubmissionStatus, string> = {
  received: 'Received',
  analysing: 'Analysing',
  awaiting_review: 'Awaiting review',
  sent_back: 'Sent back to you',
  accepted: 'Accepted',
  rejected: 'Rejected',
  withdrawn: 'Withdrawn',
  failed: 'Analysis failed',
};

export const LIKE_FOR_LIKE_LABELS: Record<LikeForLikeMode, { title: string; text: string }> = {
  direct: { title: 'Direct', text: 'Both meters measure the same thing, so their totals are compared directly.' },
  via_balance: {
    title: 'Via leg balance',
    text: 'One meter measures a single leg: it is compared with that leg of the other meter, using its balance.',
  },
  mixed: {
    title: 'Mixed',
    text: 'The meters measure different things and no balance was recorded, so leg imbalance is part of the difference.',
  },
};

export const SEVERITY_LABELS: Record<FlagSeverity, string> = { info: 'Note', warning: 'Check', severe: 'Problem' };
