import { Passport } from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import { Tenant } from '../models/Tenant';
import { User } from '../models/User';
import { dummyPasswordHash, verifyPassword } from './passwords';

/** The message for a wrong e-mail and a wrong password alike: no hint which was wrong. */
export const BAD_CREDENTIALS = 'That e-mail and password do not match a Mullion sign-in.';

/** Loads a user by id with their firm; deliberately cross-firm (the session names the user). */
export function loadUserWithTenant(id: string): Promise<User | null> {
  return User.findOne({
    where: { id },
    include: [{ model: Tenant, as: 'tenant' }],
    crossTenant: true,
  });
}

export type PassportInstance = InstanceType<typeof Passport>;

export function createPassport(): PassportInstance {
  const passport = new Passport();

  passport.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password' }, (email, password, done) => {
      (async () => {
        const user = await User.findOne({
          where: { email: email.trim().toLowerCase() },
          include: [{ model: Tenant, as: 'tenant' }],
          crossTenant: true, // sign-in is by e-mail, which is unique across the service
        });
        const ok = await verifyPassword(password, user?.passwordHash ?? (await dummyPasswordHash()));
        if (!user || !ok) return done(null, false, { message: BAD_CREDENTIALS });
        return done(null, user);
      })().catch(done);
    }),
  );

  passport.serializeUser((user, done) => done(null, user.id));
  passport.deserializeUser((id: string, done) => {
    loadUserWithTenant(id)
      .then((user) => done(null, user ?? false))
      .catch(done);
  });
  return passport;
}
