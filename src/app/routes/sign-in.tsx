import { Navigate, useSearchParams } from 'react-router-dom';
import { useMe } from '@/features/auth/api/get-me';
import { signInUrl } from '@/features/auth/sign-in-url';

export function SignInRoute() {
  const [params] = useSearchParams();
  const returnTo = params.get('returnTo') ?? undefined;
  const me = useMe();
  if (me.data) return <Navigate to={returnTo ?? '/account'} replace />;
  return (
    <section aria-labelledby="sign-in" className="max-w-xl space-y-5 py-10">
      <p className="text-caption font-semibold uppercase tracking-widest text-ember-700">Your account</p>
      <h1 id="sign-in" className="text-title font-semibold">
        Sign in to Crosswatt
      </h1>
      <p className="text-ink-soft">
        Browsing the figures never needs an account. Sign in to submit paired recordings, follow how they are vetted and take part in the
        discussion of a model. We only read your name, handle and e-mail address from the sign-in service.
      </p>
      <a
        href={signInUrl(returnTo)}
        className="inline-block rounded-full bg-fjord-700 px-6 py-2.5 font-medium text-paper hover:bg-fjord-900"
      >
        Continue to the sign-in service
      </a>
    </section>
  );
}
