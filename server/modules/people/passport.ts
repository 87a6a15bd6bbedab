/** passport-local over the people's credentials; the session keeps only the user id. */
import { Passport } from "passport";
import { Strategy as LocalStrategy } from "passport-local";
import type { DataSource } from "typeorm";
import { verifyCredentials } from "./password.commands";
import { signedIn } from "./user.queries";

export type PassportInstance = InstanceType<typeof Passport>;

export function createPassport(ds: DataSource): PassportInstance {
  const passport = new Passport();
  passport.use(
    new LocalStrategy({ usernameField: "email", passwordField: "password", session: true }, (email, password, done) => {
      verifyCredentials(ds, email, password)
        .then((u) => done(null, (u && signedIn(ds, u.id)) || false))
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
