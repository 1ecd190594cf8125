import "server-only";
import { headers as nextHeaders } from "next/headers";
import { forbidden, redirect } from "next/navigation";
import { getAuth } from "@/lib/auth";
import { getDb } from "@/db/client";
import { getMembershipForUser } from "@/db/queries/members";
import { findLiveApiKey } from "@/db/queries/api-keys";
import { bearerKey, hashApiKey } from "@/lib/api-keys";
import { AppError, errorResponse, notSignedIn, wrongRole } from "@/lib/errors";
import { ANY_ROLE, ROLE_LABEL, type Role } from "@/lib/roles";

/** The signed-in person and the organisation and role they act in. */
export interface Viewer {
  userId: string;
  name: string;
  email: string;
  orgId: string;
  orgName: string;
  role: Role;
}

/**
 * Session (or API key) → membership. Null when not signed in, the key is unknown or revoked, or the
 * person is not a member of the organisation. A key acts with its creator's current role in the key's organisation.
 */
export async function getViewer(headers: Headers): Promise<Viewer | null> {
  const key = bearerKey(headers);
  if (key) {
    const db = await getDb();
    const owner = await findLiveApiKey(db, { hash: hashApiKey(key) });
    if (!owner) return null;
    const membership = await getMembershipForUser(db, { userId: owner.userId, activeOrgId: owner.orgId });
    if (!membership || membership.orgId !== owner.orgId) return null;
    return { userId: owner.userId, name: owner.name, email: owner.email, ...membership };
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

/**
 * The one access check. 401 without a session, 403 for a role not in `roles`.
 * Organisation scoping is the caller's next step: every query takes `viewer.orgId`,
 * and a record of another organisation is reported as not found (404), never as forbidden.
 */
export async function requireViewer(headers: Headers, roles: readonly Role[] = ANY_ROLE): Promise<Viewer> {
  const viewer = await getViewer(headers);
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
      const viewer = await requireViewer(req.headers, roles);
      const params = ctx?.params ? await ctx.params : ({} as P);
      return await fn({ req, viewer, params });
    } catch (err) {
      return errorResponse(err);
    }
  };
}

/** For server components: sign-in page without a session, 403 page for the wrong role. */
export async function requirePageViewer(roles: readonly Role[] = ANY_ROLE): Promise<Viewer> {
  const h = await nextHeaders();
  const viewer = await getViewer(h);
  if (!viewer) redirect(loginUrl(h));
  if (!roles.includes(viewer.role)) forbidden();
  return viewer;
}

/** The sign-in page, returning to the page asked for (proxy.ts passes it in x-plotproof-path). */
function loginUrl(h: Headers): string {
  const path = h.get("x-plotproof-path");
  return path && path !== "/" && path.startsWith("/") && !path.startsWith("//")
    ? `/login?next=${encodeURIComponent(path)}`
    : "/login";
}

/** For server actions: the same checks, reported as a typed error state instead of a throw. */
export async function actionViewer(roles: readonly Role[]): Promise<Viewer> {
  return requireViewer(await nextHeaders(), roles);
}

export { AppError };
