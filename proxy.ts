import { NextResponse, type NextRequest } from "next/server";

// Tells server components which page was asked for, so sign-in can return there.
// Access itself is checked in every page, route handler and action, never here.
export function proxy(req: NextRequest) {
  const headers = new Headers(req.headers);
  headers.set("x-plotproof-path", req.nextUrl.pathname + req.nextUrl.search);
  return NextResponse.next({ request: { headers } });
}

export const config = { matcher: ["/((?!api|_next/static|_next/image|mark.svg|demo/).*)"] };
