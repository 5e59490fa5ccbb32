import type { ReactNode } from 'react';
import type { Role } from '@shared/roles';
import type { CurrentUser } from '@shared/schemas/auth';
import { useMe } from '../api/get-me';
import { NotAllowed } from './not-allowed';
import { SignInPrompt } from './sign-in-prompt';

/**
 * Renders children for a signed-in person (holding one of `roles`, if given);
 * otherwise a sign-in prompt or the not-allowed page. Never a blank screen.
 */
export function RequireAccess({ roles, children }: { roles?: Role[]; children: (me: CurrentUser) => ReactNode }) {
  const me = useMe();
  if (me.isPending)
    return (
      <p className="py-10 text-ink-soft" role="status">
        Checking who you are…
      </p>
    );
  if (me.isError)
    return (
      <p className="py-10 text-alert-800" role="alert">
        We could not check your account: {me.error.message}
      </p>
    );
  if (!me.data) return <SignInPrompt />;
  if (roles && !roles.some((role) => me.data!.roles.includes(role))) {
    return <NotAllowed message={`This page is for ${roles.join(' or ')}s.`} />;
  }
  return <>{children(me.data)}</>;
}
