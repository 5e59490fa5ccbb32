import { useLocation } from 'react-router-dom';
import { signInUrl } from '../sign-in-url';

/** Shown instead of a page that needs an account: what it is for, and one button. */
export function SignInPrompt({ reason = 'You need to be signed in to see this page.' }: { reason?: string }) {
  const location = useLocation();
  return (
    <section aria-labelledby="sign-in-needed" className="max-w-xl space-y-4 py-10">
      <p className="text-caption font-semibold uppercase tracking-widest text-ember-700">Sign-in needed</p>
      <h1 id="sign-in-needed" className="text-title font-semibold">
        Sign in to continue
      </h1>
      <p className="text-ink-soft">{reason} Browsing the figures never needs an account.</p>
      <a
        href={signInUrl(location.pathname + location.search)}
        className="inline-block rounded-full bg-fjord-700 px-5 py-2 font-medium text-paper hover:bg-fjord-900"
      >
        Sign in
      </a>
    </section>
  );
}
