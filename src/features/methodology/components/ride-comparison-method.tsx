import { DRIVETRAIN_LOSS_FRACTION } from '@shared/analysis/like-for-like';
import {
  BLOCK_SECONDS,
  MAX_CADENCE_LAG_SECONDS,
  MAX_CARRY_SECONDS,
  MAX_CLOCK_OFFSET_SECONDS,
  MAX_HEAD_UNIT_SMOOTHING_SECONDS,
  METHOD_VERSION,
} from '@shared/analysis/method';
import { PageSection } from '@/components/ui/page-section';

/** The per-ride comparison (method version 2, issue 14): each step with the reason for it, and its known limits. */
export function RideComparisonMethod() {
  return (
    <>
      <PageSection title={`One comparison, step by step (method version ${METHOD_VERSION})`}>
        <ol className="list-decimal space-y-2 pl-5">
          <li>
            <strong>Timeline.</strong> Each recording is put on a one-second grid. A gap of up to {MAX_CARRY_SECONDS} s keeps the last value
            (head units that record only on change do this all the time); a longer gap counts as no data.
          </li>
          <li>
            <strong>Clock offset.</strong> Before aligning, each file's own likely dropouts (zero power while its own cadence says the rider
            pedals, and short silences between riding seconds) are set aside, so a dozen radio losses cannot pull the alignment. The two
            power traces are then slid against each other by up to ±{MAX_CLOCK_OFFSET_SECONDS} s. A head unit that averages power looks late
            by half its averaging window, which used to be taken for clock offset and then for cadence delay; so we also test "this file was
            averaged over n seconds" for n up to {MAX_HEAD_UNIT_SMOOTHING_SECONDS} s, averaging the other file the same way, and keep the
            best fit. The offset is then the clocks' own.
          </li>
          <li>
            <strong>Cadence delay.</strong> Found from cadence alone, on the aligned clocks, within ±{MAX_CADENCE_LAG_SECONDS} s, with each
            file's cadence dropouts set aside. A meter can only report cadence late, so the later cadence is moved earlier by this delay
            before anything else uses it.
          </li>
          <li>
            <strong>Dropouts.</strong> A power dropout is at least 3 s of no or zero power while the other meter shows pedalling of its own:
            at least 50 W and, where it records cadence, at least 30 rpm. A head unit's average spills power into the first seconds of every
            coast; requiring cadence keeps that from counting as the other meter's dropout. Cadence dropouts (no cadence while the other
            reads 30 rpm) are looked for after the cadence delay is removed, so stops and starts do not count. Rates are per pedalling hour.
          </li>
          <li>
            <strong>Bias.</strong> 100 × (ΣA / ΣB − 1), the ratio of the energies over every second both files report and neither meter is
            in a dropout, coasting included. Averaging moves energy into the seconds after a stop but keeps it, so this ratio does not
            depend on either head unit's smoothing; method 1 summed only seconds where both read above zero, which cut the smoothed side's
            tail off at every coast.
          </li>
          <li>
            <strong>Agreement.</strong> {BLOCK_SECONDS}-second blocks of seconds where both read power (Bland–Altman limits, Pearson and
            Lin's concordance, Deming regression); the bias is also split by power band and cadence band.
          </li>
          <li>
            <strong>Like for like.</strong> Two meters that measure the same thing are compared directly. A single-leg meter against a dual
            meter that records left/right balance is compared with the dual meter's same leg; without balance the comparison is marked
            mixed. Hubs and trainers measure after the chain and are expected to read about{' '}
            {Math.round(DRIVETRAIN_LOSS_FRACTION * 1000) / 10} % lower.
          </li>
          <li>
            <strong>Quality flags.</strong> Moderators see them before they accept a ride: short overlap, traces that barely move together,
            a bias beyond 15 %, identical files, implausible values, many long gaps, a mixed comparison, one recording averaged over seconds
            more than the other, and, new in version 2, <em>an estimate on its search bound</em> (the best clock offset lies outside ±
            {MAX_CLOCK_OFFSET_SECONDS} s: severe; or the cadence delay beyond ±{MAX_CADENCE_LAG_SECONDS} s), and{' '}
            <em>a firmware or recording-device tag that disagrees with the file's own device data</em> (severe for the power meter's
            firmware, because it moves the ride into another version's figures). The same two files uploaded again, in either order, are
            refused as a re-upload.
          </li>
          <li>
            <strong>Drift, temperature and batteries.</strong> The ride is cut into five-minute blocks; each block's difference is a ratio
            of energies, as the bias, and a straight line through the blocks gives how many points per hour the difference moves, with its
            95 % t interval. Blocks rather than seconds, because neighbouring seconds share smoothing and lag. A slope of at least 1 point
            per hour whose interval excludes zero, over at least an hour of blocks, raises a warning: a meter not zeroed before the start,
            or one that changes as it warms or cools. Where a head unit records temperature, the bias is also given per band (below 5, 5–15,
            15–25, 25 °C and above), and the power meter's battery reports in the file (state and voltage) are listed on the ride page.
          </li>
        </ol>
      </PageSection>

      <PageSection title="How well the comparison recovers the truth">
        <p>
          <code>npm run validate:engine</code> runs 400 simulated pairs with fixed seeds (bias −5 to +5 %, clock offsets up to ±200 s,
          cadence delays of 0–5 s, 0–10 dropouts a side, noise, every-second and change-only recording, the partner averaging over 1, 3, 5
          or 10 s, rides of 0.5–3 h of every profile). With method {METHOD_VERSION}: no false power or cadence dropout in any of the pairs
          without injected ones; every injected dropout counted; the bias within ±0.3 percentage points of the truth in every pair (1st–99th
          percentile of the error −0.10 to +0.16 pp); the clock offset exact in 99.4 % of pairs inside the window (off by 1 s otherwise);
          every pair outside the window flagged.
        </p>
        <p className="mt-3">
          <strong>Re-analysis.</strong> When the method changes, every stored ride is analysed again with the new one from its stored
          streams; moderators' decisions stay, an accepted ride whose new result raises a severe flag goes back to the review queue with the
          reason, and the statistics are rebuilt once at the end. Every page says which method version its figures come from.
        </p>
      </PageSection>

      <PageSection title="Known limits of this method">
        <ul className="list-disc space-y-2 pl-5">
          <li>
            Head-unit averaging is modelled as a trailing average of up to {MAX_HEAD_UNIT_SMOOTHING_SECONDS} s; other filters are fitted
            approximately and show as slightly wider limits of agreement, not as bias.
          </li>
          <li>Without cadence in either file, a power dropout needs the other meter to read riding power for a whole averaging window.</li>
          <li>A tag check needs the file to name the power meter's firmware; many files do not, and then the tag cannot be checked.</li>
        </ul>
      </PageSection>
    </>
  );
}
