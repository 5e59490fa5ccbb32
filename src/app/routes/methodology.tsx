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
import { RIDER_WEIGHT_CAP_HOURS, WEIGHT_CAP_HOURS } from '@shared/statistics/weighted-bias';
import { PageSection } from '@/components/ui/page-section';
import { FileRefusals } from '@/features/methodology/components/file-refusals';
import { RideComparisonMethod } from '@/features/methodology/components/ride-comparison-method';

export function MethodologyRoute() {
  return (
    <article className="mx-auto max-w-3xl text-body text-ink">
      <h1 className="text-title font-semibold">How Crosswatt's figures are made</h1>
      <p className="mt-2 text-lead text-ink-soft">
        Comparison method version {METHOD_VERSION}. Every public figure comes from accepted submissions only.
      </p>

      <aside className="mt-6 rounded-card border-l-4 border-ember-500 bg-ember-50 px-4 py-3">
        <p className="font-semibold text-ember-900">Not a calibration certificate</p>
        <p className="mt-1 text-ink">
          These figures are gathered from riders' own rides. They describe how a model has behaved for the people who shared data, not how
          your unit will behave. Follow the maker's calibration and zero-offset instructions. Do not use these figures for medical decisions
          or anything race-critical.
        </p>
      </aside>

      <PageSection title="One ride, two meters">
        <p>
          A rider records the same ride with two power meters at once and uploads both files. We line the recordings up (allowing a clock
          difference of up to {MAX_CLOCK_OFFSET_SECONDS} s), keep only seconds where both meters report, and need at least{' '}
          {MIN_OVERLAP_SECONDS / 60} minutes of overlap. The ride's <strong>bias</strong> is how much more energy meter A counted than meter
          B, in percent. Each side of the ride counts for its own model: meter B's figure is the same comparison turned round. We also count{' '}
          <strong>dropouts</strong> (moments a meter stops reporting while the rider is pedalling), the delay between the two meters'
          cadence, and how each meter follows sprints. Agreement is judged on {BLOCK_SECONDS}-second blocks: the limits of agreement are the
          mean difference ± {LIMITS_OF_AGREEMENT_Z} standard deviations.
        </p>
      </PageSection>

      <RideComparisonMethod />

      <FileRefusals />

      <PageSection title="From rides to a model's figures">
        <ul className="list-disc space-y-2 pl-5">
          <li>
            <strong>The rider is the unit of evidence</strong>: each rider owns one unit, one installation and usually one partner meter, so
            their rides are alike and are not independent evidence about the model. Every interval and test below is built from per-rider
            summaries and counts riders, not rides. Treating every ride as independent, simulated crowds (rider-to-rider SD of bias 1 %,
            ride-to-ride 0.7 %, 1–10 rides per rider) got 95 % bias intervals that held the truth only 58–69 % of the time, and a model page
            whose firmware changed nothing said "changed" on 59–88 % of pages; with the rider as the unit they hold it 94–96 % of the time
            (npm run validate:statistics).
          </li>
          <li>
            <strong>Bias</strong>: in two stages. First each rider's mean bias, their rides weighted by pedalling time (one ride counting at
            most {WEIGHT_CAP_HOURS} hours); then the weighted mean of the riders' means, each rider counting for their hours up to{' '}
            {RIDER_WEIGHT_CAP_HOURS} hours. Once a rider has a few hours, the differences between riders' units dominate, so more hours of
            the same rider add little, and the cap keeps one prolific rider from standing for the model. The 95 % interval is a t interval
            from the spread between riders, on riders − 1 degrees of freedom (fewer, by Satterthwaite's formula, when the riders' weights
            differ). It shows how well the model's average is known, not how far one ride may stray. Mixed comparisons (one leg against a
            total meter without balance) measure the comparison, not the meter: they add no bias, but their dropouts count.
          </li>
          <li>
            <strong>Scatter</strong>: the standard deviation of the rides' biases: how consistent the meter is from ride to ride. The pooled
            limits of agreement show how far a single 30-second block may differ.
          </li>
          <li>
            <strong>Dropouts</strong>: events per pedalling hour. Riders' installations differ, so some riders see many more dropouts than
            others (overdispersion). The interval is built on the log of the rate from the riders' own counts: the larger of the
            rider-clustered (sandwich) variance and the quasi-Poisson variance with its dispersion from the riders' Pearson residuals, with
            a t quantile on riders − 1 degrees of freedom. It is never narrower than the exact Poisson interval, which we show (and say so)
            where the riders differ no more than chance allows. The dropout breakdown by surface, indoor or outdoor, recording device,
            recording mode and other meters switched on still uses exact Poisson intervals.
          </li>
          <li>
            <strong>Firmware against its predecessor</strong>: the difference of the rider-level mean biases (Welch's t-test on the two
            between-rider standard errors) and the ratio of the dropout rates (the two clustered log rates, never below the exact
            conditional test's p-value). All tests on a model's page, two per firmware step, are adjusted together with Holm's method, and
            each step gets a verdict in words: "better" or "worse" only when an adjusted p-value is below 5 %, "no clear change" otherwise,
            and "not enough riders yet" below the minimum. A bias is better when it is closer to zero.
          </li>
          <li>
            <strong>Consensus offset</strong>: each like-for-like ride links two meters; fitting all links together (weighted least squares
            on the log of the energy ratio) places every model and firmware against the crowd's consensus. We show it only for meters
            compared with at least {MINIMUM_PARTNERS} others.
          </li>
          <li>
            <strong>Minimum evidence</strong>: counted in riders. Below {MINIMUM_RIDERS} riders (or {MINIMUM_SUBMISSIONS} accepted rides) we
            write "not enough riders yet" instead of a number: one or two riders' units, installations and partners are not a model's.
          </li>
        </ul>
      </PageSection>

      <PageSection title="Battery life and temperature">
        <ul className="list-disc space-y-2 pl-5">
          <li>
            <strong>Batteries</strong>: riders log each battery change or recharge on My meters, with the firmware the meter runs and why
            the battery before came out. A battery's hours are the rider's submitted rides with a meter of that model and position on its
            days (not counted when the rider has two such meters, since the rides could be either's) plus riding the rider adds by hand,
            which we mark as self-reported. A battery that ran flat or warned ends its life; one changed early, and the one still in the
            meter, count as "at least this long" (censored).
          </li>
          <li>
            <strong>Median hours per battery</strong>: read off the Kaplan–Meier curve, which uses censored batteries without pretending
            they died. Its 95 % interval comes from resampling riders, not batteries, because one rider's batteries are alike (the same
            riding, climate and cells). Below {MIN_BATTERIES} batteries or {MIN_BATTERY_RIDERS} riders we write "not enough batteries yet";
            while fewer than half have run flat we write "more than" the longest time followed. The maker's claim is shown beside it, as a
            moderator entered it with its source.
          </li>
          <li>
            <strong>Firmware against its predecessor</strong>: a log-rank test whose variance is summed over riders (the robust score test
            of Lin and Wei), with Holm's adjustment over all of a model's firmware steps. The verdict says "run flat sooner" or "last
            longer" only when the adjusted p-value is below 5 %; otherwise "no clear difference" or "not enough batteries yet".
          </li>
          <li>
            <strong>Bias by temperature</strong>: each accepted ride's bias in each band of the head unit's temperature, as the model's
            meter read it against its partner; each rider's rides are averaged first and the interval is a t interval over riders, shown
            from {MIN_TEMPERATURE_RIDERS} riders. The head unit measures the air near the bars, not the meter itself.
          </li>
        </ul>
      </PageSection>

      <PageSection title="What the figures do not say">
        <p>
          A bias is always relative to the partner meters riders happened to own: if most partners read high, a truthful meter looks low.
          The consensus offset softens this but is still a consensus, not a laboratory reference. Riders choose which rides to share, and
          their meters may be worn, misinstalled or not zeroed. Wide intervals mean we do not know yet; overlapping intervals mean the data
          cannot tell two meters or firmware versions apart.
        </p>
      </PageSection>

      <PageSection title="Open data">
        <p>
          The scoreboard and every accepted ride's derived figures (no rider, no location, the month only) can be downloaded as CSV from the{' '}
          <Link to="/scoreboard" className="text-fjord-700 underline">
            scoreboard
          </Link>
          , under the{' '}
          <a href={OPEN_DATA_LICENCE.url} className="text-fjord-700 underline">
            {OPEN_DATA_LICENCE.name}
          </a>{' '}
          licence: use it freely, naming Crosswatt.
        </p>
      </PageSection>
    </article>
  );
}
