// Tests wait for a state, never for a fixed time: the probe is polled until it
// returns a value (anything but undefined/false/null), with a generous bound.
export async function waitFor<T>(
  probe: () => Promise<T | undefined | null | false> | T | undefined | null | false,
  { timeoutMs = 30_000, intervalMs = 100, what = 'the expected state' }: { timeoutMs?: number; intervalMs?: number; what?: string } = {},
): Promise<T> {
  const until = Date.now() + timeoutMs;
  for (;;) {
    const value = await probe();
    if (value !== undefined && value !== null && value !== false) return value;
    if (Date.now() > until) throw new Error(`timed out after ${timeoutMs} ms waiting for ${what}`);
    await new Promise((resolve) => setTimeout(resolve, intervalMs));
  }
}
