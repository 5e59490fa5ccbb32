export function SiteFooter() {
  return (
    <footer className="border-t border-paper-line bg-paper-deep">
      <div className="mx-auto max-w-page px-5 py-6 text-caption text-ink-soft sm:px-8">
        Crowdsourced comparisons, not a calibration certificate: follow your meter maker's calibration and zero-offset instructions, and
        never adjust a head unit while riding.
      </div>
    </footer>
  );
}
