import { useId, useState } from 'react';
import { MEASUREMENT_POSITIONS, type MeasurementPosition } from '@shared/analysis/types';
import {
  MODEL_KIND_LABELS,
  MODEL_KINDS,
  type ModelKind,
  proposeCatalogueEntryInput,
  RECORDING_DEVICE_KINDS,
} from '@shared/schemas/catalogue';
import { ApiError } from '@/lib/api-client';
import { useProposeCatalogueEntry } from '../api/propose-catalogue-entry';
import { POSITION_LABELS, RECORDING_DEVICE_KIND_LABELS } from '../lib/labels';
import { FieldError, inputBorder, inputClass } from './form-controls';

type ProposalType = 'maker' | 'model' | 'firmware' | 'recording_device';

const WHAT: Record<ProposalType, string> = {
  maker: 'maker',
  model: 'model',
  firmware: 'firmware version',
  recording_device: 'recording device',
};

/**
 * "Can't find it? Propose it": a small inline panel (not a nested form) that adds
 * a pending catalogue entry the rider can use at once.
 */
export function ProposeEntry({
  type,
  makerId,
  modelId,
  onProposed,
}: {
  type: ProposalType;
  makerId?: number;
  modelId?: number;
  onProposed: (id: number) => void;
}) {
  const [open, setOpen] = useState(false);
  const [name, setName] = useState('');
  const [position, setPosition] = useState<MeasurementPosition>('total');
  const [kind, setKind] = useState<string>(type === 'recording_device' ? 'head_unit' : 'crank_arm');
  const [error, setError] = useState<string>();
  const propose = useProposeCatalogueEntry();
  const baseId = useId();
  const panelId = `${baseId}-panel`;
  const what = WHAT[type];
  const missingParent = (type === 'model' && !makerId) || (type === 'firmware' && !modelId);

  function submit() {
    const raw =
      type === 'maker'
        ? { type, name }
        : type === 'model'
          ? { type, makerId, name, position, kind }
          : type === 'firmware'
            ? { type, modelId, version: name }
            : { type, name, kind };
    const parsed = proposeCatalogueEntryInput.safeParse(raw);
    if (!parsed.success) {
      setError(parsed.error.issues[0]?.message ?? 'check this entry');
      return;
    }
    setError(undefined);
    propose.mutate(parsed.data, {
      onSuccess: ({ entry }) => {
        onProposed(entry.id);
        setOpen(false);
        setName('');
      },
      onError: (err) =>
        setError(
          err instanceof ApiError
            ? err.details?.fields
              ? Object.values(err.details.fields)[0]
              : err.message
            : 'The proposal could not be sent.',
        ),
    });
  }

  if (missingParent) return null;
  return (
    <div className="mt-1.5">
      <button
        type="button"
        aria-expanded={open}
        aria-controls={panelId}
        onClick={() => setOpen((o) => !o)}
        className="text-caption font-medium text-fjord-700 underline decoration-fjord-300 underline-offset-2 hover:text-fjord-900"
      >
        {open ? 'Cancel the proposal' : `Can’t find the ${what}? Propose it`}
      </button>
      {open && (
        <div id={panelId} className="mt-2 space-y-3 rounded-lg border border-dashed border-fjord-300 bg-fjord-50 p-3">
          <p className="text-caption text-ink-soft">
            You can use it in this submission at once; it shows as “pending” until a moderator checks it.
          </p>
          <div>
            <label htmlFor={`${baseId}-name`} className="mb-1 block text-caption font-semibold">
              {type === 'firmware' ? 'Version number' : `Name of the ${what}`}
            </label>
            <input
              id={`${baseId}-name`}
              value={name}
              onChange={(e) => setName(e.target.value)}
              onKeyDown={(e) => {
                if (e.key === 'Enter') {
                  e.preventDefault();
                  submit();
                }
              }}
              placeholder={type === 'firmware' ? 'e.g. 4.12.0' : undefined}
              aria-invalid={error ? true : undefined}
              aria-describedby={error ? `${baseId}-error` : undefined}
              className={`${inputClass} ${inputBorder(Boolean(error))}`}
            />
          </div>
          {type === 'model' && (
            <div className="grid gap-3 sm:grid-cols-2">
              <SmallSelect
                id={`${baseId}-position`}
                label="Measures"
                value={position}
                onChange={(v) => setPosition(v as MeasurementPosition)}
                options={MEASUREMENT_POSITIONS.map((p) => [p, POSITION_LABELS[p]])}
              />
              <SmallSelect
                id={`${baseId}-kind`}
                label="Kind"
                value={kind}
                onChange={setKind}
                options={MODEL_KINDS.map((k: ModelKind) => [k, MODEL_KIND_LABELS[k]])}
              />
            </div>
          )}
          {type === 'recording_device' && (
            <SmallSelect
              id={`${baseId}-kind`}
              label="Kind"
              value={kind}
              onChange={setKind}
              options={RECORDING_DEVICE_KINDS.map((k) => [k, RECORDING_DEVICE_KIND_LABELS[k]])}
            />
          )}
          <FieldError id={`${baseId}-error`} message={error} />
          <button
            type="button"
            onClick={submit}
            disabled={propose.isPending}
            className="rounded-full bg-fjord-700 px-4 py-1.5 text-caption font-semibold text-paper hover:bg-fjord-900 disabled:opacity-60"
          >
            {propose.isPending ? 'Sending…' : `Propose this ${what}`}
          </button>
        </div>
      )}
    </div>
  );
}

function SmallSelect({
  id,
  label,
  value,
  onChange,
  options,
}: {
  id: string;
  label: string;
  value: string;
  onChange: (value: string) => void;
  options: Array<[string, string]>;
}) {
  return (
    <div>
      <label htmlFor={id} className="mb-1 block text-caption font-semibold">
        {label}
      </label>
      <select id={id} value={value} onChange={(e) => onChange(e.target.value)} className={`${inputClass} ${inputBorder(false)}`}>
        {options.map(([v, l]) => (
          <option key={v} value={v}>
            {l}
          </option>
        ))}
      </select>
    </div>
  );
}
