import "server-only";
import { betterAuth } from "better-auth";
import { drizzleAdapter } from "better-auth/adapters/drizzle";
import { organization } from "better-auth/plugins";
import { APIError, createAuthMiddleware } from "better-auth/api";
import { nextCookies } from "better-auth/next-js";
import { createAccessControl } from "better-auth/plugins/access";
import { defaultStatements, ownerAc, memberAc } from "better-auth/plugins/organization/access";
import * as schema from "@/db/schema";
import { getDb, type DB } from "@/db/client";
import { env } from "@/lib/server/env";
import { sendInvitationMail, sendPasswordResetMail } from "@/lib/server/mail/notify";
import { clearSignInFailures, getSignInFailures, saveSignInFailures } from "@/db/queries/sign-in-failures";
import { afterFailure, secondsLocked } from "@/lib/security/sign-in-backoff";

/** Password-reset links work for one hour. */
const RESET_LINK_SECONDS = 60 * 60;

// better-auth's organisation permissions (members, invitations) for our four roles.
// Plotproof's own permissions are checked by role name in lib/server/access.ts.
const ac = createAccessControl(defaultStatements);
const orgRoles = {
  owner: ac.newRole(ownerAc.statements),
  qa_lead: ac.newRole(memberAc.statements),
  technician: ac.newRole(memberAc.statements),
  grower: ac.newRole(memberAc.statements),
};

/**
 * The only better-auth endpoints a browser may call over HTTP: the sign-in page, sign-out, the session
 * and password reset. Sign-up, organisations and memberships go through Plotproof's own actions and
 * routes (which call better-auth on the server), so nobody can create an organisation or switch a
 * session into one behind the product's back.
 */
const HTTP_AUTH_PATHS = new Set([
  "/sign-in/email",
  "/sign-out",
  "/get-session",
  "/request-password-reset",
  "/reset-password",
  "/reset-password/:token",
]);

/** The e-mail of a sign-in request, as the per-account backoff keys it. */
function signInEmail(body: unknown): string | null {
  const email = (body as { email?: unknown } | undefined)?.email;
  return typeof email === "string" && email.length <= 254 ? email.trim().toLowerCase() : null;
}

export function createAuth(
  db: DB,
  opts: { baseURL: string; secret: string; signInPerMinute?: number; trustedProxies?: string[]; now?: () => Date },
) {
  const now = opts.now ?? (() => new Date());
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
    advanced: {
      // The HTTP server (lib/server/http/serve.mjs) puts the socket's address last in X-Forwarded-For and keeps
      // earlier entries only from TRUSTED_PROXIES; the limit reads the chain from the right past those proxies.
      ipAddress: { ipAddressHeaders: ["x-forwarded-for"], trustedProxies: opts.trustedProxies ?? [] },
    },
    // Per-account backoff (lib/security/sign-in-backoff.ts), whatever address the attempts come from.
    hooks: {
      before: createAuthMiddleware(async (ctx) => {
        if (ctx.request && !HTTP_AUTH_PATHS.has(ctx.path)) throw new APIError("NOT_FOUND", { message: "Not found." });
        if (ctx.path !== "/sign-in/email") return;
        const email = signInEmail(ctx.body);
        if (!email) return;
        const wait = secondsLocked(await getSignInFailures(db, { email }), now());
        if (wait > 0) {
          throw new APIError(
            "TOO_MANY_REQUESTS",
            {
              message: `Too many wrong passwords for this account. Try again in ${wait} s, or reset the password.`,
              code: "SIGN_IN_BACKOFF",
            },
            { "retry-after": String(wait) },
          );
        }
      }),
      after: createAuthMiddleware(async (ctx) => {
        if (ctx.path !== "/sign-in/email") return;
        const email = signInEmail(ctx.body);
        if (!email) return;
        const returned = ctx.context.returned;
        if (returned instanceof APIError) {
          if (returned.statusCode !== 401) return;
          const record = afterFailure(await getSignInFailures(db, { email }), now());
          await saveSignInFailures(db, { email, record });
        } else {
          await clearSignInFailures(db, { email });
        }
      }),
    },
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
        trustedProxies: e.trustedProxies,
      });
    });
    g.__plotproofAuth.catch(() => {
      g.__plotproofAuth = undefined;
    });
  }
  return g.__plotproofAuth;
}

export const PASSWORD_MIN = 10;
