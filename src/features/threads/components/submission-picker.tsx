import { signedPercent } from '@/lib/format-figures';
import { MAX_LINKED_SUBMISSIONS } from '@shared/schemas/threads';
import { useLinkableSubmissions } from '../api/get-linkable-submissions';

/** The rider's own accepted submissions of this model, to link as evidence. */
export function SubmissionPicker({
  modelSlug,
  selected,
  onChange,
}: {
  modelSlug: string;
  selected: number[];
  onChange: (ids: number[]) => void;
}) {
  const linkable = useLinkableSubmissions(modelSlug, true);
  const submissions = linkable.data?.submissions ?? [];
  if (submissions.length === 0) return null;
  const toggle = (id: number) =>
    onChange(selected.includes(id) ? selected.filter((s) => s !== id) : [...selected, id].slice(0, MAX_LINKED_SUBMISSIONS));
  return (
    <fieldset className="space-y-1">
      <legend className="text-caption font-semibold text-ink">Link your accepted submissions as evidence</legend>
      <div className="flex flex-wrap gap-2">
        {submissions.map((s) => (
          <label key={s.id} className="flex items-center gap-2 rounded-lg border border-paper-line px-2.5 py-1 text-caption">
            <input type="checkbox" checked={selected.includes(s.id)} onChange={() => toggle(s.id)} />#{s.id} · fw {s.firmware} · A vs B{' '}
            {signedPercent(s.biasPercent)}
          </label>
        ))}
      </div>
    </fieldset>
  );
}
