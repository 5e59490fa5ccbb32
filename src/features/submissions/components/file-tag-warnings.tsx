import type { TagDisagreement } from '@shared/analysis/tag-check';

const WHAT: Record<TagDisagreement['field'], string> = {
  firmware: "the power meter's firmware",
  recording_device: 'the recording device',
  recording_device_firmware: "the recording device's firmware",
};

/** Where the rider's tags and the file's own device data disagree, said before sending: a wrong firmware tag puts the ride in another version's figures. */
export function FileTagWarnings({ side, disagreements }: { side: 'a' | 'b'; disagreements: TagDisagreement[] }) {
  if (disagreements.length === 0) return null;
  return (
    <div
      role="status"
      className="rounded-lg border border-caution-600/40 bg-caution-100 px-4 py-3 text-caption text-ink"
      data-testid={`file-tag-warnings-${side}`}
    >
      <p className="font-semibold text-caution-600">The file says otherwise</p>
      <ul className="mt-1 list-disc space-y-0.5 pl-5">
        {disagreements.map((d) => (
          <li key={d.field}>
            For {WHAT[d.field]} you chose <strong>{d.tagged}</strong>; the file says <strong>{d.inFile}</strong>. Check it before sending: a
            moderator will see the same disagreement.
          </li>
        ))}
      </ul>
    </div>
  );
}
