import { Passport } from 'passport';
import { type Profile, Strategy as GitHubStrategy, type StrategyOptions } from 'passport-github2';
import { type Config, publicUrl } from '../config/env';
import type { Db } from '../db/knex';
import { loadSessionUser, signInWithProfile } from '../features/users/users.service';
import './session-user';

export const OAUTH_PROVIDER = 'github';

// One Passport instance per app (not the module-wide singleton), so several
// apps with different settings can live in one process, as in the tests.
export function createPassport({ config, db }: { config: Config; db: Db }) {
  const passport = new Passport();
  const options = {
    clientID: config.OAUTH_CLIENT_ID,
    clientSecret: config.OAUTH_CLIENT_SECRET,
    callbackURL: `${publicUrl(config)}/auth/github/callback`,
    // Unset in production: passport-github2 then talks to the real provider.
    authorizationURL: config.OAUTH_AUTHORIZE_URL,
    tokenURL: config.OAUTH_TOKEN_URL,
    userProfileURL: config.OAUTH_PROFILE_URL,
    userEmailURL: config.OAUTH_EMAILS_URL,
    scope: ['user:email'],
    // passport-oauth2 keeps a random state in the session and checks it on the way
    // back (its typings only know the older string form).
    state: true,
  };
  const strategy = new GitHubStrategy(
    options as unknown as StrategyOptions,
    (_accessToken: string, _refreshToken: string, profile: Profile, done: (err: unknown, user?: Express.User) => void) => {
      signInWithProfile(db, {
        provider: OAUTH_PROVIDER,
        providerId: String(profile.id),
        login: profile.username,
        name: profile.displayName,
        email: profile.emails?.[0]?.value,
        avatarUrl: profile.photos?.[0]?.value,
      }).then((user) => done(null, user), done);
    },
  );
  if (config.OAUTH_FAKE) {
    // Lets scripted tests pick an identity on the fake provider without its form.
    const params = strategy as unknown as { authorizationParams(options: { login?: string }): object };
    params.authorizationParams = (options) => (options.login ? { login: options.login } : {});
  }
  passport.use(OAUTH_PROVIDER, strategy);

  passport.serializeUser<number>((user, done) => done(null, user.id));
  passport.deserializeUser<number>((id, done) => {
    // A deleted account signs out everywhere: `false` drops it from the session.
    loadSessionUser(db, id).then((user) => done(null, user ?? false), done);
  });
  return passport;
}

export type AppPassport = ReturnType<typeof createPassport>;
