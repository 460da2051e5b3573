import passport from 'passport'
import { Strategy as LocalStrategy } from 'passport-local'
import { loadSessionUser, verifyCredentials } from '@server/modules/auth/auth.service'

/** One Passport per app, so tests that build several apps share no state. */
export function createPassport() {
  const p = new passport.Passport()
  p.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password' }, (email, password, done) => {
      verifyCredentials(email, password).then((u) => done(null, u ?? false), done)
    }),
  )
  p.serializeUser((user, done) => done(null, user.id))
  p.deserializeUser((id: number, done) => {
    loadSessionUser(id).then((u) => done(null, u ?? false), done)
  })
  return p
}
