// A rider's true effort over a ride, second by second: what a perfect meter would
// read. Meters (meter.ts) then record their own view of it.
import { createRandom, type Random } from './random';

export type RideProfile = 'endurance' | 'intervals' | 'race' | 'indoor';

export interface RideOptions {
  seed: number;
  durationSeconds: number;
  /** Unix seconds of the ride's first second. */
  startTime: number;
  profile?: RideProfile;
  riderFtpWatts?: number;
  /** The rider's usual right-leg share of total power, in %. */
  balanceRightPercent?: number;
}

export interface TrueRide {
  startTime: number;
  profile: RideProfile;
  /** Total crank power in W, one value per second from startTime. */
  power: Float32Array;
  /** Cadence in rpm; zero while coasting or stopped. */
  cadence: Float32Array;
  /** Right leg's share of total power, 0…1. */
  rightShare: Float32Array;
}

type SegmentKind = 'warm-up' | 'steady' | 'climb' | 'work' | 'recovery' | 'surge' | 'sprint' | 'coast' | 'stop' | 'restart' | 'cool-down';

interface Segment {
  kind: SegmentKind;
  seconds: number;
  /** Target power at the start and end of the segment, as a fraction of FTP. */
  from: number;
  to: number;
  cadence: number;
}

const DEFAULT_FTP_WATTS = 250;
const DEFAULT_BALANCE_RIGHT_PERCENT = 51;
const COOL_DOWN_SECONDS = 300;

export function simulateRide(options: RideOptions): TrueRide {
  const profile = options.profile ?? 'endurance';
  const ftp = options.riderFtpWatts ?? DEFAULT_FTP_WATTS;
  const durationSeconds = Math.max(1, Math.round(options.durationSeconds));
  const random = createRandom(options.seed);

  const segments = planSegments(profile, durationSeconds, random);
  const { power, cadence } = renderEffort(segments, durationSeconds, ftp, profile === 'indoor', random);
  const rightShare = renderBalance(durationSeconds, (options.balanceRightPercent ?? DEFAULT_BALANCE_RIGHT_PERCENT) / 100, random);

  return { startTime: options.startTime, profile, power, cadence, rightShare };
}

// ---------------------------------------------------------------------------
// The plan: a list of segments whose shape depends on the kind of ride.
// Intensities as fractions of FTP follow common training practice (from memory):
// endurance 0.55–0.75, threshold work 0.95–1.15, sprints 2.5–3.5.

function planSegments(profile: RideProfile, durationSeconds: number, random: Random): Segment[] {
  const segments: Segment[] = [];
  const coolDown = Math.min(COOL_DOWN_SECONDS, Math.round(durationSeconds * 0.08));
  const warmUp = Math.min(profile === 'race' ? 300 : 600, Math.round(durationSeconds * 0.12));
  segments.push({ kind: 'warm-up', seconds: warmUp, from: 0.45, to: 0.68, cadence: 86 });

  // A race ends in a sprint for the line, kept clear of the plan's main part.
  const finishSprint = profile === 'race' && durationSeconds > 600 ? 12 : 0;
  const mainEnd = durationSeconds - coolDown - finishSprint;
  let elapsed = warmUp;
  const add = (segment: Segment) => {
    const seconds = Math.min(Math.round(segment.seconds), mainEnd - elapsed);
    if (seconds <= 0) return;
    segments.push({ ...segment, seconds });
    elapsed += seconds;
  };
  const steady = (level: number, seconds: number) =>
    add({ kind: 'steady', seconds, from: level, to: level, cadence: random.uniform(84, 94) });
  const sprint = () => {
    const peak = random.uniform(2.5, 3.5);
    add({ kind: 'sprint', seconds: random.integer(8, 15), from: peak, to: peak * 0.75, cadence: random.uniform(108, 122) });
    add({ kind: 'recovery', seconds: random.integer(60, 150), from: 0.45, to: 0.45, cadence: 82 });
  };
  const coast = (min: number, max: number) => add({ kind: 'coast', seconds: random.integer(min, max), from: 0, to: 0, cadence: 0 });
  const stopStart = () => {
    add({ kind: 'stop', seconds: random.integer(15, 60), from: 0, to: 0, cadence: 0 });
    add({ kind: 'restart', seconds: random.integer(8, 15), from: 1.6, to: 1.0, cadence: 78 });
  };

  if (profile === 'intervals' || profile === 'indoor') {
    const outdoor = profile === 'intervals';
    const repeats = random.integer(4, 6);
    const workSeconds = random.integer(3, 8) * 60;
    const workLevel = random.uniform(0.98, 1.12);
    steady(0.65, random.integer(120, 300));
    for (let i = 0; i < repeats && elapsed < mainEnd; i += 1) {
      add({ kind: 'work', seconds: workSeconds, from: workLevel, to: workLevel, cadence: random.uniform(88, 96) });
      add({ kind: 'recovery', seconds: random.integer(120, 240), from: 0.5, to: 0.5, cadence: 84 });
      if (outdoor && random.chance(0.4)) coast(5, 20);
    }
    for (let i = 0; i < 3 && elapsed < mainEnd; i += 1) sprint();
    while (elapsed < mainEnd) {
      steady(random.uniform(0.6, 0.75), random.integer(180, 600));
      if (outdoor && random.chance(0.3)) coast(5, 30);
      if (outdoor && random.chance(0.1)) stopStart();
    }
  } else if (profile === 'race') {
    while (elapsed < mainEnd) {
      const roll = random.next();
      if (roll < 0.35) add({ kind: 'steady', seconds: random.integer(60, 300), from: 0.7, to: 0.7, cadence: random.uniform(86, 96) });
      else if (roll < 0.55)
        add({ kind: 'surge', seconds: random.integer(15, 90), from: random.uniform(1.2, 1.7), to: 1.1, cadence: random.uniform(95, 105) });
      else if (roll < 0.8) coast(5, 25);
      else if (roll < 0.9) sprint();
      else add({ kind: 'climb', seconds: random.integer(120, 420), from: 0.95, to: 1.05, cadence: random.uniform(72, 82) });
    }
    if (finishSprint > 0) {
      const peak = random.uniform(2.8, 3.5);
      segments.push({ kind: 'sprint', seconds: finishSprint, from: peak, to: peak * 0.7, cadence: 118 });
    }
  } else {
    while (elapsed < mainEnd) {
      const roll = random.next();
      if (roll < 0.15) add({ kind: 'climb', seconds: random.integer(120, 480), from: 0.85, to: 0.95, cadence: random.uniform(72, 80) });
      else steady(random.uniform(0.6, 0.78), random.integer(180, 600));
      if (random.chance(0.3)) coast(5, 40);
      if (random.chance(0.12)) stopStart();
      if (random.chance(0.1)) sprint();
    }
  }

  segments.push({ kind: 'cool-down', seconds: durationSeconds - sumSeconds(segments), from: 0.5, to: 0.4, cadence: 82 });
  return segments.filter((segment) => segment.seconds > 0);
}

function sumSeconds(segments: Segment[]): number {
  return segments.reduce((sum, segment) => sum + segment.seconds, 0);
}

// ---------------------------------------------------------------------------
// Rendering: targets become seconds with the rider's variability. Outdoors, power
// from one second to the next varies far more than indoors (terrain, wind, gears).

function renderEffort(segments: Segment[], durationSeconds: number, ftp: number, indoor: boolean, random: Random) {
  const power = new Float32Array(durationSeconds);
  const cadence = new Float32Array(durationSeconds);
  const slowSd = indoor ? 0.03 : 0.08;
  const fastSd = indoor ? 0.025 : 0.07;
  const slowKeep = Math.exp(-1 / 20); // AR(1) with a 20 s time constant
  const slowInnovation = Math.sqrt(1 - slowKeep * slowKeep);
  let slow = 0;
  let cadenceWander = 0;
  let lastPower = 0;
  let lastCadence = 0;

  let t = 0;
  for (const segment of segments) {
    const pedalling = segment.cadence > 0;
    // Sprints and restarts rise within a second or two; other changes take a few.
    const response = segment.kind === 'sprint' || segment.kind === 'restart' ? 0.6 : 0.3;
    for (let i = 0; i < segment.seconds && t < durationSeconds; i += 1, t += 1) {
      slow = slow * slowKeep + slowSd * slowInnovation * random.normal();
      cadenceWander = cadenceWander * 0.9 + (indoor ? 0.5 : 1) * random.normal();
      if (!pedalling) {
        lastPower = 0;
        lastCadence = 0;
        continue;
      }
      const fraction = segment.seconds > 1 ? i / (segment.seconds - 1) : 0;
      const target = ftp * (segment.from + (segment.to - segment.from) * fraction);
      lastPower += (target - lastPower) * response;
      const value = lastPower * (1 + slow) * (1 + fastSd * random.normal());
      power[t] = Math.max(1, value);
      lastCadence += (segment.cadence - lastCadence) * (lastCadence === 0 ? 0.7 : 0.35);
      cadence[t] = Math.min(140, Math.max(30, lastCadence + cadenceWander));
    }
  }
  return { power, cadence };
}

function renderBalance(durationSeconds: number, meanRightShare: number, random: Random): Float32Array {
  const rightShare = new Float32Array(durationSeconds);
  const keep = Math.exp(-1 / 30);
  const innovation = Math.sqrt(1 - keep * keep);
  let drift = 0;
  for (let t = 0; t < durationSeconds; t += 1) {
    drift = drift * keep + 0.012 * innovation * random.normal();
    const share = meanRightShare + drift + 0.008 * random.normal();
    rightShare[t] = Math.min(0.7, Math.max(0.3, share));
  }
  return rightShare;
}
