import { Link } from 'react-router-dom';

/** The "403" page: signed in, but this needs a role the person does not hold. */
export function NotAllowed({ message = 'Your account does not have the role this page needs.' }: { message?: string }) {
  return (
    <section aria-labelledby="not-allowed" className="max-w-xl space-y-4 py-10">
      <p className="text-caption font-semibold uppercase tracking-widest text-alert-600">Not allowed</p>
      <h1 id="not-allowed" className="text-title font-semibold">
        This part is not open to you
      </h1>
      <p className="text-ink-soft">{message} If you think you should have it, ask one of Crosswatt’s admins.</p>
      <Link to="/" className="inline-block rounded-full bg-fjord-700 px-5 py-2 font-medium text-paper hover:bg-fjord-900">
        Back to the overview
      </Link>
    </section>
  );
}
