import "server-only";
import { headers as nextHeaders } from "next/headers";
import { forbidden, redirect } from "next/navigation";
import { getAuth } from "@/lib/server/auth";
import { getDb } from "@/db/client";
import { getMembershipForUser } from "@/db/queries/members";
import { findLiveApiKey } from "@/db/queries/api-keys";
import { bearerKey, hashApiKey } from "@/lib/server/api-keys";
import { AppError, errorResponse, notSignedIn, wrongRole } from "@/lib/errors";
import { ANY_ROLE, ROLE_LABEL, type Role } from "@/lib/roles";
import { type ApiKeyScope, keyScopeAllows, scopeRefusal } from "@/lib/security/key-scope";

/** The signed-in person and the organisation and role they act in. */
export interface Viewer {
  userId: string;
  name: string;
  email: string;
  orgId: string;
  orgName: string;
  role: Role;
  /** Set when the request came with an API key: what that key may do within `role`. */
  keyScope?: ApiKeyScope;
}

/** What is being asked for: the key scope check needs it (a page is a GET, a server action a POST). */
export interface AskedFor {
  method: string;
  /** Path without the query string, e.g. /api/fields. */
  pathname: string;
}

/**
 * Session (or API key) → membership. Null when not signed in, the key is unknown or revoked, or the
 * person is not a member of the organisation. A key acts with its creator's current role in the key's organisation,
 * narrowed by its scope: an expired key throws 401 saying when it expired, a request outside the key's scope 403
 * naming the scope. Every route handler, page and server action comes through here, so this is the one place.
 */
export async function getViewer(headers: Headers, asked: AskedFor): Promise<Viewer | null> {
  const key = bearerKey(headers);
  if (key) {
    const db = await getDb();
    const found = await findLiveApiKey(db, { hash: hashApiKey(key) });
    if (!found) return null;
    if (found.expiredAt) throw keyExpired(found.expiredAt);
    const membership = await getMembershipForUser(db, { userId: found.userId, activeOrgId: found.orgId });
    if (!membership || membership.orgId !== found.orgId) return null;
    if (!keyScopeAllows(found.scope, asked.method, asked.pathname))
      throw new AppError("forbidden", scopeRefusal(found.scope, asked.method, asked.pathname));
    return { userId: found.userId, name: found.name, email: found.email, ...membership, keyScope: found.scope };
  }
  const auth = await getAuth();
  const session = await auth.api.getSession({ headers });
  if (!session) return null;
  const db = await getDb();
  const membership = await getMembershipForUser(db, {
    userId: session.user.id,
    activeOrgId: (session.session as { activeOrganizationId?: string | null }).activeOrganizationId,
  });
  if (!membership) return null;
  return { userId: session.user.id, name: session.user.name, email: session.user.email, ...membership };
}

function keyExpired(at: Date): AppError {
  const [day, time] = at.toISOString().slice(0, 16).split("T");
  return new AppError(
    "unauthenticated",
    `This API key expired on ${day} at ${time} UTC. An owner can create a new key under API keys.`,
  );
}

/**
 * The one access check. 401 without a session, 403 for a role not in `roles` or a request outside the API key's
 * scope. Organisation scoping is the caller's next step: every query takes `viewer.orgId`,
 * and a record of another organisation is reported as not found (404), never as forbidden.
 */
export async function requireViewer(
  headers: Headers,
  asked: AskedFor,
  roles: readonly Role[] = ANY_ROLE,
): Promise<Viewer> {
  const viewer = await getViewer(headers, asked);
  if (!viewer) throw notSignedIn();
  if (!roles.includes(viewer.role)) throw wrongRole(roles.map((r) => ROLE_LABEL[r]).join(" or "));
  return viewer;
}

type RouteContext<P> = { params: Promise<P> };

/**
 * Wrap a route handler: checks session and role first, then runs `fn`, turning thrown
 * AppErrors into JSON error bodies. `fn` parses its input with zod and scopes every query to `viewer.orgId`.
 */
export function guardedRoute<P = Record<string, never>>(
  roles: readonly Role[],
  fn: (args: { req: Request; viewer: Viewer; params: P }) => Promise<Response>,
) {
  return async (req: Request, ctx: RouteContext<P>): Promise<Response> => {
    try {
      const viewer = await requireViewer(
        req.headers,
        { method: req.method, pathname: new URL(req.url).pathname },
        roles,
      );
      const params = ctx?.params ? await ctx.params : ({} as P);
      return await fn({ req, viewer, params });
    } catch (err) {
      return errorResponse(err);
    }
  };
}

/** For server components: sign-in page without a session, 403 page for the wrong role or an API key's scope. */
export async function requirePageViewer(roles: readonly Role[] = ANY_ROLE): Promise<Viewer> {
  const h = await nextHeaders();
  let viewer: Viewer | null;
  try {
    viewer = await getViewer(h, { method: "GET", pathname: askedPath(h) });
  } catch (err) {
    if (!(err instanceof AppError)) throw err;
    if (err.code === "forbidden") forbidden();
    viewer = null; // an expired key: sign in instead
  }
  if (!viewer) redirect(loginUrl(h));
  if (!roles.includes(viewer.role)) forbidden();
  return viewer;
}

/** The path of the page or action asked for (proxy.ts passes it in x-plotproof-path), without its query string. */
function askedPath(h: Headers): string {
  return (h.get("x-plotproof-path") ?? "").split("?")[0];
}

/** The sign-in page, returning to the page asked for (proxy.ts passes it in x-plotproof-path). */
function loginUrl(h: Headers): string {
  const path = h.get("x-plotproof-path");
  return path && path !== "/" && path.startsWith("/") && !path.startsWith("//")
    ? `/login?next=${encodeURIComponent(path)}`
    : "/login";
}

/** For server actions (a POST to the page's path): the same checks, reported as a typed error state instead of a throw. */
export async function actionViewer(roles: readonly Role[]): Promise<Viewer> {
  const h = await nextHeaders();
  return requireViewer(h, { method: "POST", pathname: askedPath(h) }, roles);
}

export { AppError };
