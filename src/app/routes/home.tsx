const audiences = [
  {
    title: 'Riders with two meters',
    text: 'Record one ride on two power meters at once, upload both files, and see how closely they agree: bias, scatter, dropouts and how fast each reacts in a sprint.',
  },
  {
    title: 'Shoppers',
    text: 'Before you buy, see how each model and firmware version has held up against other meters on real rides, with honest intervals and no account needed.',
  },
  {
    title: 'Moderators',
    text: 'Vet the comparisons that come in, with automatic quality flags for pairings that look wrong, and keep the catalogue of models and firmware tidy.',
  },
  {
    title: 'Makers’ support staff',
    text: 'Hear about a problem from many riders at once, answer in the discussion of your models, and show when a firmware update fixed it.',
  },
];

export function HomeRoute() {
  return (
    <div className="space-y-14">
      <section className="max-w-3xl space-y-5">
        <p className="text-caption font-semibold uppercase tracking-widest text-ember-700">Power meter accuracy, measured on real rides</p>
        <h1 className="text-display font-semibold text-ink">How far can you trust a power meter?</h1>
        <p className="text-lead text-ink-soft">
          Makers promise ±1–2 %. On the road, meters drift, drop out and disagree, and a firmware update can make things better or worse.
          Crosswatt collects rides recorded on two meters at once, measures how well the pair agrees, and pools thousands of such
          comparisons into figures per model and firmware version.
        </p>
      </section>
      <section aria-labelledby="who" className="space-y-5">
        <h2 id="who" className="text-title font-semibold">
          Who it is for
        </h2>
        <ul className="grid gap-4 sm:grid-cols-2">
          {audiences.map((a) => (
            <li key={a.title} className="rounded-card border border-paper-line bg-white/70 p-6 shadow-card">
              <h3 className="mb-2 font-semibold text-fjord-700">{a.title}</h3>
              <p className="text-ink-soft">{a.text}</p>
            </li>
          ))}
        </ul>
      </section>
    </div>
  );
}
