import "server-only";
import { betterAuth } from "better-auth";
import { drizzleAdapter } from "better-auth/adapters/drizzle";
import { organization } from "better-auth/plugins";
import { nextCookies } from "better-auth/next-js";
import { createAccessControl } from "better-auth/plugins/access";
import { defaultStatements, ownerAc, memberAc } from "better-auth/plugins/organization/access";
import * as schema from "@/db/schema";
import { getDb, type DB } from "@/db/client";
import { env } from "@/lib/env";
import { sendInvitationMail, sendPasswordResetMail } from "@/lib/mail/notify";

/** Password-reset links work for one hour. */
const RESET_LINK_SECONDS = 60 * 60;

// better-auth's organisation permissions (members, invitations) for our four roles.
// Plotproof's own permissions are checked by role name in lib/access.ts.
const ac = createAccessControl(defaultStatements);
const orgRoles = {
  owner: ac.newRole(ownerAc.statements),
  qa_lead: ac.newRole(memberAc.statements),
  technician: ac.newRole(memberAc.statements),
  grower: ac.newRole(memberAc.statements),
};

export function createAuth(db: DB, opts: { baseURL: string; secret: string; signInPerMinute?: number }) {
  const origin = new URL(opts.baseURL);
  return betterAuth({
    baseURL: opts.baseURL,
    secret: opts.secret,
    database: drizzleAdapter(db, { provider: "pg", schema }),
    // Browsers may reach a local install as localhost or 127.0.0.1.
    trustedOrigins: [
      opts.baseURL,
      `${origin.protocol}//localhost:${origin.port || 3000}`,
      `${origin.protocol}//127.0.0.1:${origin.port || 3000}`,
    ],
    emailAndPassword: {
      enabled: true,
      autoSignIn: true,
      minPasswordLength: 10,
      maxPasswordLength: 128,
      // E-mail the one-time link; a reset signs the account out everywhere else.
      resetPasswordTokenExpiresIn: RESET_LINK_SECONDS,
      revokeSessionsOnPasswordReset: true,
      sendResetPassword: async ({ user, url }) => {
        await sendPasswordResetMail({ user, url }, RESET_LINK_SECONDS / 60);
      },
    },
    // Sign-in attempts per minute per address; the browser tests raise it (AUTH_SIGNIN_PER_MINUTE).
    rateLimit: {
      enabled: true,
      window: 60,
      max: 300,
      customRules: { "/sign-in/email": { window: 60, max: opts.signInPerMinute ?? 10 } },
    },
    session: { expiresIn: 60 * 60 * 24 * 7, updateAge: 60 * 60 * 24 },
    plugins: [
      organization({
        ac,
        roles: orgRoles,
        creatorRole: "owner",
        allowUserToCreateOrganization: true,
        invitationExpiresIn: 60 * 60 * 24 * 7,
        // The mailer never throws: a failed e-mail is recorded in the activity log and the team page shows the link.
        sendInvitationEmail: async (data) => {
          await sendInvitationMail(data);
        },
      }),
      nextCookies(),
    ],
    telemetry: { enabled: false },
  });
}

export type Auth = ReturnType<typeof createAuth>;

const g = globalThis as unknown as { __plotproofAuth?: Promise<Auth> };

export function getAuth(): Promise<Auth> {
  if (!g.__plotproofAuth) {
    g.__plotproofAuth = getDb().then((db) => {
      const e = env();
      return createAuth(db, {
        baseURL: e.BETTER_AUTH_URL,
        secret: e.authSecret,
        signInPerMinute: e.AUTH_SIGNIN_PER_MINUTE,
      });
    });
    g.__plotproofAuth.catch(() => {
      g.__plotproofAuth = undefined;
    });
  }
  return g.__plotproofAuth;
}

export const PASSWORD_MIN = 10;
