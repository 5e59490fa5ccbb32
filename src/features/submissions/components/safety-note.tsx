export function SafetyNote() {
  return (
    <aside
      aria-label="Before you act on this"
      className="rounded-card border border-caution-600/30 bg-caution-100 p-5 text-caption text-ink"
    >
      <p className="font-semibold">Read this as a comparison, not a calibration certificate.</p>
      <p className="mt-1">
        It shows how two meters agreed on one ride, as recorded by riders like you. Before relying on either meter, follow its maker’s
        calibration and zero-offset instructions, and never fiddle with a head unit while riding.
      </p>
    </aside>
  );
}
