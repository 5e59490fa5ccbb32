import { MAX_RECORDING_SPAN_SECONDS, MAX_RECORDS_PER_FILE, SESSION_TOLERANCE_SECONDS } from '@shared/analysis/decode-fit';
import { MAX_CLOCK_OFFSET_SECONDS, MIN_OVERLAP_SECONDS } from '@shared/analysis/method';
import { MAX_FIT_FILE_BYTES } from '@shared/limits';
import { PageSection } from '@/components/ui/page-section';

const count = (n: number) => n.toLocaleString('en-GB');

/** Every reason an upload is refused, with its code (as POST /api/submissions answers it) and its bound. */
const REFUSALS: Array<{ code: string; what: string }> = [
  {
    code: 'payload_too_large',
    what: `A file is larger than ${MAX_FIT_FILE_BYTES / 1024 / 1024} MB. A day's ride at one record a second is far below this.`,
  },
  { code: 'not_fit', what: 'The file is not a FIT file (its header does not say ".FIT"): a photo, a GPX or TCX export, a renamed file.' },
  {
    code: 'not_activity',
    what: 'The file is a FIT file but not a recorded ride: settings, a workout, a course, weight or all-day monitoring, or a FIT file with no ride records at all.',
  },
  {
    code: 'damaged_file',
    what: 'A checksum does not match what it covers, a message uses a type the file never defined, or a message runs past the end of the data. The message says which part is wrong.',
  },
  {
    code: 'ended_early',
    what: "The file stops before the end its own header promises, or its final checksum is missing: what a head unit leaves when its battery dies mid-ride, or a cut-off download. We do not repair such files: a salvaged ride could be missing any part, so we refuse it and ask for the device's own saved copy.",
  },
  {
    code: 'implausible_timestamps',
    what: `The records span more than ${MAX_RECORDING_SPAN_SECONDS / 3600} h, or some lie more than ${SESSION_TOLERANCE_SECONDS / 3600} h outside the ride's own start and end as the file gives them. A device clock that jumped cannot be lined up with another file.`,
  },
  {
    code: 'too_many_records',
    what: `The file holds more than ${count(MAX_RECORDS_PER_FILE)} records (a day at 16 records a second is ${count(16 * 86_400)}). Counted before anything is set aside for them, so such a file costs almost nothing to refuse.`,
  },
  {
    code: 'too_costly',
    what: 'Reading the file takes more time or memory than any ride recording does; it is stopped rather than read to the end.',
  },
  {
    code: 'no_power',
    what: 'The recording has no power values at all: the power meter was probably not paired with the head unit on that ride.',
  },
  { code: 'too_short', what: `The recording lasts less than ${MIN_OVERLAP_SECONDS / 60} minutes, the shortest ride we compare.` },
  { code: 'identical_files', what: 'Both files are the same recording; file B must come from the other device.' },
  {
    code: 'no_overlap / short_overlap',
    what: `The two recordings do not overlap in time, or overlap for less than ${MIN_OVERLAP_SECONDS / 60} minutes, allowing ${MAX_CLOCK_OFFSET_SECONDS} s of clock difference.`,
  },
];

export function FileRefusals() {
  return (
    <PageSection
      title="Files we refuse, and why"
      intro="Every file is checked when it is uploaded, before anything is stored: a refused upload stores nothing and its message names the file and the reason. Records out of time order are sorted, chained FIT files are read part by part, and every header variant the FIT protocol allows is read."
    >
      <dl className="space-y-3">
        {REFUSALS.map(({ code, what }) => (
          <div key={code}>
            <dt>
              <code className="font-semibold">{code}</code>
            </dt>
            <dd className="mt-0.5 text-ink-soft">{what}</dd>
          </div>
        ))}
      </dl>
    </PageSection>
  );
}
