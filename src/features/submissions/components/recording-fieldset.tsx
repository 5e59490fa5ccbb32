import { MEASUREMENT_POSITIONS, type Side } from '@shared/analysis/types';
import { type Catalogue, MODEL_KIND_LABELS, versionOrder } from '@shared/schemas/catalogue';
import { RECORDING_MODES, ZERO_OFFSET_ANSWERS } from '@shared/schemas/submission';
import { POSITION_LABELS, RECORDING_MODE_LABELS, ZERO_OFFSET_LABELS } from '../lib/labels';
import type { FieldErrors, RecordingDraft } from '../lib/submission-draft';
import { CataloguePicker, type PickerOption } from './catalogue-picker';
import { ChoiceGroup, FieldError, inputBorder, inputClass } from './form-controls';
import { ProposeEntry } from './propose-entry';

const pending = (status: string) => (status === 'pending' ? 'pending review' : undefined);

/** Maker → model → firmware, position, recording device and the rider's answers for one file. */
export function RecordingFieldset({
  side,
  catalogue,
  draft,
  onChange,
  errors,
}: {
  side: Side;
  catalogue: Catalogue;
  draft: RecordingDraft;
  onChange: (draft: RecordingDraft) => void;
  errors: FieldErrors;
}) {
  const id = (field: string) => `${side}-${field}`;
  const error = (field: string) => errors[`${side}.${field}`];
  // Until a model is chosen the position has nothing to be filled from: the model's message is enough.
  const positionError = draft.modelId ? error('position') : undefined;
  const set = (patch: Partial<RecordingDraft>) => onChange({ ...draft, ...patch });

  const makers: PickerOption[] = catalogue.makers.map((m) => ({ value: m.id, label: m.name, note: pending(m.status) }));
  const models: PickerOption[] = catalogue.models
    .filter((m) => String(m.makerId) === draft.makerId)
    .map((m) => ({ value: m.id, label: `${m.name} · ${MODEL_KIND_LABELS[m.kind].toLowerCase()}`, note: pending(m.status) }));
  const firmware: PickerOption[] = catalogue.firmware
    .filter((f) => String(f.modelId) === draft.modelId)
    .sort((x, y) => compareVersions(y.version, x.version))
    .map((f) => ({
      value: f.id,
      label: f.version,
      note: [f.beta && 'beta', f.releasedOn && `released ${f.releasedOn}`, pending(f.status)].filter(Boolean).join(', ') || undefined,
    }));
  const devices: PickerOption[] = catalogue.recordingDevices.map((d) => ({ value: d.id, label: d.name, note: pending(d.status) }));

  function chooseModel(modelId: string) {
    const model = catalogue.models.find((m) => String(m.id) === modelId);
    // The position comes from the model; the rider may still change it (e.g. a dual meter recording one side).
    set({ modelId, firmwareId: '', position: model?.position ?? '' });
  }

  return (
    <div className="space-y-5">
      <div className="grid gap-4 sm:grid-cols-3">
        <div>
          <CataloguePicker
            id={id('maker')}
            label="Maker"
            placeholder="Choose the maker"
            options={makers}
            value={draft.makerId}
            onChange={(makerId) => set({ makerId, modelId: '', firmwareId: '', position: '' })}
            error={error('makerId')}
          />
          <ProposeEntry
            type="maker"
            onProposed={(makerId) => set({ makerId: String(makerId), modelId: '', firmwareId: '', position: '' })}
          />
        </div>
        <div>
          <CataloguePicker
            id={id('model')}
            label="Model"
            placeholder={draft.makerId ? 'Choose the model' : 'Choose a maker first'}
            options={models}
            value={draft.modelId}
            onChange={chooseModel}
            disabled={!draft.makerId}
            error={draft.makerId ? error('modelId') : undefined}
          />
          <ProposeEntry
            type="model"
            makerId={Number(draft.makerId) || undefined}
            onProposed={(modelId) => set({ modelId: String(modelId), firmwareId: '', position: '' })}
          />
        </div>
        <div>
          <CataloguePicker
            id={id('firmware')}
            label="Firmware"
            placeholder={draft.modelId ? 'Choose the version' : 'Choose a model first'}
            options={firmware}
            value={draft.firmwareId}
            onChange={(firmwareId) => set({ firmwareId })}
            disabled={!draft.modelId}
            error={draft.modelId ? error('firmwareId') : undefined}
          />
          <ProposeEntry
            type="firmware"
            modelId={Number(draft.modelId) || undefined}
            onProposed={(firmwareId) => set({ firmwareId: String(firmwareId) })}
          />
        </div>
      </div>

      <div>
        <label htmlFor={id('position')} className="mb-1.5 block text-caption font-semibold text-ink">
          What this meter measures
        </label>
        <select
          id={id('position')}
          value={draft.position}
          onChange={(e) => set({ position: e.target.value as RecordingDraft['position'] })}
          aria-invalid={positionError ? true : undefined}
          aria-describedby={positionError ? `${id('position')}-error` : undefined}
          className={`${inputClass} ${inputBorder(Boolean(positionError))} sm:max-w-sm`}
        >
          <option value="">Filled in from the model</option>
          {MEASUREMENT_POSITIONS.map((p) => (
            <option key={p} value={p}>
              {POSITION_LABELS[p]}
            </option>
          ))}
        </select>
        <FieldError id={`${id('position')}-error`} message={positionError} />
      </div>

      <div className="grid gap-4 sm:grid-cols-2">
        <div>
          <CataloguePicker
            id={id('device')}
            label="Recorded with"
            placeholder="Head unit, watch or app"
            options={devices}
            value={draft.recordingDeviceId}
            onChange={(recordingDeviceId) => set({ recordingDeviceId })}
            error={error('recordingDeviceId')}
          />
          <ProposeEntry type="recording_device" onProposed={(deviceId) => set({ recordingDeviceId: String(deviceId) })} />
        </div>
        <div>
          <label htmlFor={id('device-firmware')} className="mb-1.5 block text-caption font-semibold text-ink">
            Its firmware <span className="font-normal text-ink-soft">(optional)</span>
          </label>
          <input
            id={id('device-firmware')}
            value={draft.recordingDeviceFirmware}
            onChange={(e) => set({ recordingDeviceFirmware: e.target.value })}
            placeholder="e.g. 12.30"
            aria-invalid={error('recordingDeviceFirmware') ? true : undefined}
            aria-describedby={error('recordingDeviceFirmware') ? `${id('device-firmware')}-error` : undefined}
            className={`${inputClass} ${inputBorder(Boolean(error('recordingDeviceFirmware')))}`}
          />
          <FieldError id={`${id('device-firmware')}-error`} message={error('recordingDeviceFirmware')} />
        </div>
      </div>

      <ChoiceGroup
        name={id('recording-mode')}
        legend="Recording interval"
        choices={RECORDING_MODES.map((v) => ({ value: v, label: RECORDING_MODE_LABELS[v] }))}
        value={draft.recordingMode}
        onChange={(recordingMode) => set({ recordingMode })}
        error={error('recordingMode')}
      />
      <ChoiceGroup
        name={id('zero-offset')}
        legend="Zero offset done before the ride?"
        choices={ZERO_OFFSET_ANSWERS.map((v) => ({ value: v, label: ZERO_OFFSET_LABELS[v] }))}
        value={draft.zeroOffset}
        onChange={(zeroOffset) => set({ zeroOffset })}
        error={error('zeroOffset')}
      />
      <ChoiceGroup
        name={id('other-meters-on')}
        legend="Other power meters on the bike switched on?"
        choices={[
          { value: 'yes', label: 'Yes' },
          { value: 'no', label: 'No' },
        ]}
        value={draft.otherMetersOn}
        onChange={(otherMetersOn) => set({ otherMetersOn })}
        error={error('otherMetersOn')}
      />
    </div>
  );
}

function compareVersions(x: string, y: string): number {
  const a = versionOrder(x);
  const b = versionOrder(y);
  for (let i = 0; i < Math.max(a.length, b.length); i++) {
    const d = (a[i] ?? 0) - (b[i] ?? 0);
    if (d !== 0) return d;
  }
  return 0;
}
