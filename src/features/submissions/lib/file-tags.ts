import { checkTags, type TagCheck } from '@shared/analysis/tag-check';
import type { DeviceInfo } from '@shared/analysis/types';
import type { Catalogue } from '@shared/schemas/catalogue';
import type { RecordingDraft } from './submission-draft';

/** One recording's tags against its file (shared/analysis/tag-check), with the tagged model's firmware as the catalogue. */
export function checkDraftTags(device: DeviceInfo, draft: RecordingDraft, catalogue: Catalogue): TagCheck {
  const modelId = Number(draft.modelId);
  return checkTags(
    device,
    {
      firmwareId: draft.firmwareId ? Number(draft.firmwareId) : null,
      recordingDeviceId: draft.recordingDeviceId ? Number(draft.recordingDeviceId) : null,
      recordingDeviceFirmware: draft.recordingDeviceFirmware,
    },
    { firmware: catalogue.firmware.filter((f) => f.modelId === modelId), recordingDevices: catalogue.recordingDevices },
  );
}

/**
 * The draft with the blanks the file can fill: the power meter's firmware (once a model is
 * chosen and the catalogue has that version), the recording device and its firmware.
 * Answers the rider gave are never changed.
 */
export function prefillFromFile(device: DeviceInfo, draft: RecordingDraft, catalogue: Catalogue): RecordingDraft {
  const { suggestions } = checkDraftTags(device, draft, catalogue);
  return {
    ...draft,
    firmwareId: draft.firmwareId || (draft.modelId && suggestions.firmwareId !== null ? String(suggestions.firmwareId) : ''),
    recordingDeviceId: draft.recordingDeviceId || (suggestions.recordingDeviceId !== null ? String(suggestions.recordingDeviceId) : ''),
    recordingDeviceFirmware: draft.recordingDeviceFirmware || (suggestions.recordingDeviceFirmware ?? ''),
  };
}
