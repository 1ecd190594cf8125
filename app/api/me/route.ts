import { guardedRoute } from "@/lib/server/access";
import { ANY_ROLE } from "@/lib/roles";

export const GET = guardedRoute(ANY_ROLE, async ({ viewer }) =>
  Response.json({ name: viewer.name, email: viewer.email, role: viewer.role, organisation: viewer.orgName }),
);
