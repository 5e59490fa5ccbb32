import { Link, useRouteError } from 'react-router-dom';

/** After a deploy, the chunk names an open tab knows are gone: the browser says so in one of these ways. */
export function isStaleChunk(error: unknown): boolean {
  const message = error instanceof Error ? `${error.name} ${error.message}` : String(error);
  return /dynamically imported module|Importing a module script failed|error loading dynamically|ChunkLoadError|Loading chunk/i.test(
    message,
  );
}

/** Our own page when a page cannot be shown: a failed chunk after a deploy or an error while rendering. */
export function RouteErrorRoute() {
  const error = useRouteError();
  const stale = isStaleChunk(error);
  return (
    <div role="alert" className="max-w-xl space-y-4 py-10">
      <p className="text-caption font-semibold uppercase tracking-widest text-ember-700">
        {stale ? 'New version' : 'Something went wrong'}
      </p>
      <h1 className="text-title font-semibold">{stale ? 'Crosswatt has been updated' : 'This page could not be shown'}</h1>
      <p className="text-ink-soft">
        {stale
          ? 'This tab still runs the previous version, and part of this page is no longer on the server. Reload to get the new one.'
          : 'An error stopped this page. Reloading often helps; if it does not, the overview still works.'}
      </p>
      <div className="flex flex-wrap gap-3">
        <button
          type="button"
          onClick={() => window.location.reload()}
          className="rounded-full bg-fjord-700 px-5 py-2 font-medium text-paper hover:bg-fjord-900"
        >
          Reload the page
        </button>
        <Link to="/" reloadDocument className="rounded-full border border-paper-line px-5 py-2 font-medium text-ink hover:bg-paper-deep">
          Back to the overview
        </Link>
      </div>
    </div>
  );
}
