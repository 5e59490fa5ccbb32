import { Link } from 'react-router-dom';
import {
  BLOCK_SECONDS,
  LIMITS_OF_AGREEMENT_Z,
  MAX_CLOCK_OFFSET_SECONDS,
  METHOD_VERSION,
  MIN_OVERLAP_SECONDS,
} from '@shared/analysis/method';
import { OPEN_DATA_LICENCE } from '@shared/schemas/statistics';
import { MIN_BATTERIES, MIN_BATTERY_RIDERS, MIN_TEMPERATURE_RIDERS } from '@shared/statistics/battery-life';
import { MINIMUM_PARTNERS } from '@shared/statistics/consensus';
import { MINIMUM_RIDERS, MINIMUM_SUBMISSIONS } from '@shared/statistics/minimum-evidence';
import { WEIGHT_CAP_HOURS } from '@shared/statistics/weighted-bias';
import { PageSection } from '@/components/ui/page-section';
import { FileRefusals } from '@/features/methodology/components/file-refusals';
import { RideComparisonMethod } from '@/features/methodology/components/ride-comparison-method';

export function MethodologyRoute() {
  return (
    <article className="mx-auto max-w-3xl text-body text-ink">
      <h1 className="text-title font-semibold">How Crosswatt's figures are made</h1>
      <p className="mt-2 text-lead text-ink-soft">Comparison method version {METHOD_VERSION}. Every public figure comes from accepted submissions only.</p>

      <aside className="mt-6 rounded-card border-l-4 border-ember-500 bg-ember-50 px-4 py-3">
        <p className="font-semibold text-ember-900">Not a calibration certificate</p>
        <p className="mt-1 text-ink">
          These figures are gathered from riders' own rides. They describe how a model has behaved for the people who shared data, not how your unit will
          behave. Follow the maker's calibration and zero-offset instructions. Do not use these figures for medical decisions or anything race-critical.
        </p>
      </aside>

      <PageSection title="One ride, two meters">
        <p>
          A rider records the same ride with two power meters at once and uploads both files. We line the recordings up (allowing a clock difference of up to{' '}
          {MAX_CLOCK_OFFSET_SECONDS} s), keep only seconds where both meters report, and need at least {MIN_OVERLAP_SECONDS / 60} minutes of overlap. The ride's{' '}
          <strong>bias</strong> is how much more energy meter A counted than meter B, in percent. Each side of the ride counts for its own model: meter B's
          figure is the same comparison turned round. We also count <strong>dropouts</strong> (moments a meter stops reporting while the rider is pedalling),
          the delay between the two meters' cadence, and how each meter follows sprints. Agreement is judged on {BLOCK_SECONDS}-second blocks: the limits of
          agreement are the mean difference ± {LIMITS_OF_AGREEMENT_Z} standard deviations.
        </p>
      </PageSection>

      <RideComparisonMethod />

      <FileRefusals />

      <PageSection title="From rides to a model's figures">
        <ul className="list-disc space-y-2 pl-5">
          <li>
            <strong>Bias</strong>: the mean of the rides' biases weighted by pedalling time, with one ride counting at most {WEIGHT_CAP_HOURS} hours so a single
            long ride cannot dominate. The interval is a 95 % confidence interval from the t distribution over rides: it shows how well the average is known,
            not how far one ride may stray.
          </li>
          <li>
            <strong>Scatter</strong>: the standard deviation of the rides' biases: how consistent the meter is from ride to ride. The pooled limits of agreement
            show how far a single 30-second block may differ.
          </li>
          <li>
            <strong>Dropouts</strong>: events per pedalling hour with an exact Poisson interval. Firmware versions are compared by the ratio of their rates
            (exact conditional test) and by the difference in bias (Welch's t-test). Dropouts are also split by surface, indoor or outdoor, recording device,
            recording mode and whether other meters were switched on.
          </li>
          <li>
            <strong>Consensus offset</strong>: each like-for-like ride links two meters; fitting all links together (weighted least squares on the log of the
            energy ratio) places every model and firmware against the crowd's consensus. We show it only for meters compared with at least {MINIMUM_PARTNERS}{' '}
            others.
          </li>
          <li>
            <strong>Minimum evidence</strong>: below {MINIMUM_SUBMISSIONS} accepted rides or {MINIMUM_RIDERS} riders we write "not enough data yet" instead of a
            number.
          </li>
        </ul>
      </PageSection>

      <PageSection title="Battery life and temperature">
        <ul className="list-disc space-y-2 pl-5">
          <li>
            <strong>Batteries</strong>: riders log each battery change or recharge on My meters, with the firmware the meter runs and why the battery before came
            out. A battery's hours are the rider's submitted rides with a meter of that model and position on its days (not counted when the rider has two such
            meters, since the rides could be either's) plus riding the rider adds by hand, which we mark as self-reported. A battery that ran flat or warned ends
            its life; one changed early, and the one still in the meter, count as "at least this long" (censored).
          </li>
          <li>
            <strong>Median hours per battery</strong>: read off the Kaplan–Meier curve, which uses censored batteries without pretending they died. Its 95 %
            interval comes from resampling riders, not batteries, because one rider's batteries are alike (the same riding, climate and cells). Below{' '}
            {MIN_BATTERIES} batteries or {MIN_BATTERY_RIDERS} riders we write "not enough batteries yet"; while fewer than half have run flat we write "more than"
            the longest time followed. The maker's claim is shown beside it, as a moderator entered it with its source.
          </li>
          <li>
            <strong>Firmware against its predecessor</strong>: a log-rank test whose variance is summed over riders (the robust score test of Lin and Wei), with
            Holm's adjustment over all of a model's firmware steps. The verdict says "run flat sooner" or "last longer" only when the adjusted p-value is below
            5 %; otherwise "no clear difference" or "not enough batteries yet".
          </li>
          <li>
            <strong>Bias by temperature</strong>: each accepted ride's bias in each band of the head unit's temperature, as the model's meter read it against its
            partner; each rider's rides are averaged first and the interval is a t interval over riders, shown from {MIN_TEMPERATURE_RIDERS} riders. The head unit
            measures the air near the bars, not the meter itself.
          </li>
        </ul>
      </PageSection>

      <PageSection title="What the figures do not say">
        <p>
          A bias is always relative to the partner meters riders happened to own: if most partners read high, a truthful meter looks low. The consensus offset
          softens this but is still a consensus, not a laboratory reference. Riders choose which rides to share, and their meters may be worn, misinstalled or
          not zeroed. Wide intervals mean we do not know yet; overlapping intervals mean the data cannot tell two meters or firmware versions apart.
        </p>
      </PageSection>

      <PageSection title="Open data">
        <p>
          The scoreboard and every accepted ride's derived figures (no rider, no location, the month only) can be downloaded as CSV from the{' '}
          <Link to="/scoreboard" className="text-fjord-700 underline">scoreboard</Link>, under the{' '}
          <a href={OPEN_DATA_LICENCE.url} className="text-fjord-700 underline">{OPEN_DATA_LICENCE.name}</a> licence: use it freely, naming Crosswatt.
        </p>
      </PageSection>
    </article>
  );
}
