import { getAuth } from "@/lib/server/auth";

// better-auth's own endpoints: sign-in, sign-up, sign-out, session, organisation.
export async function GET(req: Request) {
  return (await getAuth()).handler(req);
}
export async function POST(req: Request) {
  return (await getAuth()).handler(req);
}
