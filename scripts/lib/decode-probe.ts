// One decoder on one file in a process of its own, for the ingest benchmark:
//   node --import tsx scripts/lib/decode-probe.ts <ours|fit-file-parser|fitsdk> <file> [repeats]
// Prints one line of JSON: the first decode's time and how far the resident set grew
// above what it was just before (the high-water mark, an upper bound: it includes the
// decoder's garbage not yet collected), then the median time of the repeats.
import { readFileSync, writeFileSync } from 'node:fs';
import { Decoder, Stream } from '@garmin/fitsdk';
import FitParser from 'fit-file-parser';
import { decodeFit } from '@shared/analysis/decode-fit';
import { AnalysisError } from '@shared/analysis/errors';
import { simpleActivity } from './fit-bytes';

export type ProbeDecoder = 'ours' | 'fit-file-parser' | 'fitsdk';

export interface ProbeResult {
  decoder: ProbeDecoder;
  /** 'read', or what the decoder said when it refused or failed. */
  outcome: string;
  firstMs: number;
  medianMs: number;
  rssBeforeBytes: number;
  peakRssGrowthBytes: number;
}

const DECODERS: Record<ProbeDecoder, (bytes: Uint8Array) => Promise<unknown> | unknown> = {
  ours: (bytes) => decodeFit(bytes),
  'fit-file-parser': (bytes) =>
    new FitParser({ force: false, mode: 'list' }).parseAsync(Buffer.from(bytes.buffer as ArrayBuffer, bytes.byteOffset, bytes.byteLength)),
  fitsdk: (bytes) => {
    const decoder = new Decoder(
      Stream.fromArrayBuffer(bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength) as ArrayBuffer),
    );
    const { errors } = decoder.read();
    if (errors.length > 0) throw errors[0];
  },
};

async function timed(decode: (bytes: Uint8Array) => unknown, bytes: Uint8Array): Promise<{ ms: number; outcome: string }> {
  const started = performance.now();
  let outcome = 'read';
  try {
    await decode(bytes);
  } catch (err) {
    outcome = err instanceof AnalysisError ? `refused: ${err.code}` : `failed: ${String(err).slice(0, 120)}`;
  }
  return { ms: performance.now() - started, outcome };
}

// A process started by fork and exec inherits its parent's resident high-water mark
// (getrusage's maxRSS), so on Linux the mark is reset here first (proc(5), clear_refs
// value 5) and read back from /proc/self/status (VmHWM).
function resetPeakRss(): void {
  try {
    writeFileSync('/proc/self/clear_refs', '5');
  } catch {
    // Not Linux: maxRSS below is then an upper bound that may include the parent's mark.
  }
}

function peakRss(): number {
  try {
    const match = /VmHWM:\s+(\d+) kB/.exec(readFileSync('/proc/self/status', 'utf8'));
    if (match) return Number(match[1]) * 1024;
  } catch {
    // Not Linux.
  }
  return process.resourceUsage().maxRSS * 1024;
}

async function probe(decoder: ProbeDecoder, path: string, repeats: number): Promise<ProbeResult> {
  const decode = DECODERS[decoder];
  // Warm the code up on a small file first, so the figures are of the decoding.
  const small = simpleActivity({ seconds: 1200 });
  for (let i = 0; i < 5; i++) await decode(small);
  const bytes: Uint8Array = readFileSync(path);
  globalThis.gc?.();
  resetPeakRss();
  const rssBeforeBytes = process.memoryUsage.rss();
  const first = await timed(decode, bytes);
  const peakRssGrowthBytes = Math.max(0, peakRss() - rssBeforeBytes);
  const times = [first.ms];
  for (let i = 1; i < repeats; i++) times.push((await timed(decode, bytes)).ms);
  times.sort((x, y) => x - y);
  return {
    decoder,
    outcome: first.outcome,
    firstMs: first.ms,
    medianMs: times[Math.floor(times.length / 2)],
    rssBeforeBytes,
    peakRssGrowthBytes,
  };
}

const [decoder, path, repeats] = process.argv.slice(2);
console.log(JSON.stringify(await probe(decoder as ProbeDecoder, path, Number(repeats ?? 1))));
