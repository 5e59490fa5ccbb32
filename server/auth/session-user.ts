import type { SessionUser } from '../features/users/users.service';

// `req.user` is the signed-in person as loaded for this request (roles and maker
// memberships fresh from the database), or undefined for visitors.
declare global {
  namespace Express {
    interface User extends SessionUser {}
  }
}

declare module 'express-session' {
  interface SessionData {
    /** Where to go after the provider sends the person back. */
    returnTo?: string;
    /** Set when a CSRF token is issued, so the session (its identifier) is kept. */
    csrfIssued?: boolean;
  }
}

export type { SessionUser };
