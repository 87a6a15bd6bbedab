/** passport-local over our user service; the session keeps only the user id. */
import { Passport } from "passport";
import { Strategy as LocalStrategy } from "passport-local";
import type { Services } from "../context";

export function createPassport(services: Services): InstanceType<typeof Passport> {
  const passport = new Passport();
  passport.use(
    new LocalStrategy({ usernameField: "email", passwordField: "password", session: true }, (email, password, done) => {
      services.users
        .verifyCredentials(email, password)
        .then((u) => done(null, (u && services.users.signedIn(u.id)) || false))
        .catch(done);
    }),
  );
  passport.serializeUser((user, done) => done(null, (user as Express.User).id));
  passport.deserializeUser((id: number, done) => {
    let user: Express.User | null;
    try {
      user = services.users.signedIn(id);
    } catch (e) {
      return done(e);
    }
    done(null, user ?? false);
  });
  return passport;
}
