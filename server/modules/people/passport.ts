/** passport-local over the people's credentials; the session keeps only the user id. */
import { Passport } from "passport";
import { Strategy as LocalStrategy } from "passport-local";
import type { DataSource } from "typeorm";
import { checkCredentials } from "./password.commands";
import { signedIn } from "./user.queries";

export type PassportInstance = InstanceType<typeof Passport>;

/** `bcryptCost` is the app's configured cost: the stand-in hash of unknown e-mails and rehashing use it. */
export function createPassport(deps: { ds: DataSource; bcryptCost?: number }): PassportInstance {
  const { ds } = deps;
  const passport = new Passport();
  passport.use(
    new LocalStrategy({ usernameField: "email", passwordField: "password", session: true }, (email, password, done) => {
      checkCredentials(deps, email, password)
        .then(({ user }) => done(null, (user && signedIn(ds, user.id)) || false))
        .catch(done);
    }),
  );
  passport.serializeUser((user, done) => done(null, (user as Express.User).id));
  passport.deserializeUser((id: number, done) => {
    let user: Express.User | null;
    try {
      user = signedIn(ds, id);
    } catch (e) {
      return done(e);
    }
    done(null, user ?? false);
  });
  return passport;
}
