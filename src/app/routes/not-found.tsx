import { Link } from 'react-router-dom';

export function NotFoundRoute() {
  return (
    <div className="max-w-xl space-y-4 py-10">
      <p className="text-caption font-semibold uppercase tracking-widest text-ember-700">404</p>
      <h1 className="text-title font-semibold">This page dropped out</h1>
      <p className="text-ink-soft">There is nothing at this address. It may have moved, or the link may be mistyped.</p>
      <Link to="/" className="inline-block rounded-full bg-fjord-700 px-5 py-2 font-medium text-paper hover:bg-fjord-900">
        Back to the overview
      </Link>
    </div>
  );
}
