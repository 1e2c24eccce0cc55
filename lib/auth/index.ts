/**
 * Sign-in with Auth.js (next-auth 5): e-mail and password, JWT sessions carrying only the user id and a session
 * version. Roles and firm are read from the membership on every request by lib/auth/actor.ts.
 */
import NextAuth, { CredentialsSignin, type DefaultSession } from "next-auth";
import type {} from "next-auth/jwt";
import Credentials from "next-auth/providers/credentials";
import { and, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { memberships, users } from "@/db/schema";
import { signInSchema } from "@/lib/validation/auth";
import { verifyPassword, dummyHash } from "./password";
import { endSessionsOf } from "@/lib/data/sessions";
import { clientAddress, isSignInBlocked, recordSignInAttempt } from "./rate-limit";

declare module "next-auth" {
  interface Session {
    user: { id: string } & DefaultSession["user"];
  }
}
declare module "next-auth/jwt" {
  interface JWT {
    uid?: string;
    sv?: number;
  }
}

/** Too many recent failures for this account from this address (or from this address, or for this account). */
class RateLimited extends CredentialsSignin {
  code = "rate_limited";
}

/** Hours a session lasts without activity. */
export const SESSION_MAX_AGE_SECONDS = 8 * 60 * 60;


export const { handlers, auth, signIn, signOut } = NextAuth({
  trustHost: true,
  session: { strategy: "jwt", maxAge: SESSION_MAX_AGE_SECONDS, updateAge: 15 * 60 },
  pages: { signIn: "/sign-in", error: "/sign-in" },
  // A refused sign-in is an expected answer, not a server fault: keep it out of the error log.
  logger: {
    error(error) {
      // Class names are minified in production builds: match on the error's type, which Auth.js keeps.
      const type = (error as { type?: string }).type ?? error.name;
      if (type === "CredentialsSignin" || error.name === "RateLimited") return;
      console.error("[auth]", error);
    },
  },
  providers: [
    Credentials({
      credentials: { email: {}, password: {} },
      async authorize(raw, request) {
        const parsed = signInSchema.safeParse(raw);
        if (!parsed.success) return null;
        const email = parsed.data.email.toLowerCase();
        // Only from the configured trusted proxy hop (BALLAST_TRUSTED_PROXY_HOPS); a client's own header is ignored.
        const address = clientAddress(request?.headers);
        if (await isSignInBlocked(email, address)) throw new RateLimited();
        const [user] = await getDb().select().from(users).where(eq(users.email, email));
        // Compare against a dummy hash when there is no such user, so the answer takes as long either way.
        const ok = await verifyPassword(parsed.data.password, user?.passwordHash ?? (await dummyHash()));
        // A person with no active membership in any firm has nothing to sign in to.
        const member = user
          ? await getDb().select({ id: memberships.id }).from(memberships).where(and(eq(memberships.userId, user.id), eq(memberships.active, true))).limit(1)
          : [];
        const accepted = Boolean(user && ok && user.active && member.length > 0);
        await recordSignInAttempt(email, address, accepted);
        if (!accepted || !user) return null;
        return { id: user.id, name: user.name, email: user.email, sessionVersion: user.sessionVersion } as never;
      },
    }),
  ],
  events: {
    // Every sign-out path, including the library's own /api/auth/signout, ends the session on the server too.
    async signOut(message) {
      const token = "token" in message ? message.token : null;
      if (token?.uid) await endSessionsOf(token.uid, token.sv ?? 1);
    },
  },
  callbacks: {
    jwt({ token, user }) {
      if (user) {
        token.uid = user.id;
        token.sv = (user as { sessionVersion?: number }).sessionVersion ?? 1;
      }
      return token;
    },
    session({ session, token }) {
      if (token.uid) session.user.id = token.uid;
      (session as { sv?: number }).sv = token.sv;
      return session;
    },
  },
});
