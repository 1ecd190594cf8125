/** One error vocabulary for route handlers, server actions and the SWR fetcher. */
export type ErrorCode =
  | "unauthenticated"
  | "forbidden"
  | "not_found"
  | "invalid_input"
  | "invalid_file"
  | "warnings_unaccepted"
  | "conflict"
  | "payload_too_large"
  | "internal";

const STATUS: Record<ErrorCode, number> = {
  unauthenticated: 401,
  forbidden: 403,
  not_found: 404,
  invalid_input: 422,
  invalid_file: 422,
  warnings_unaccepted: 422,
  conflict: 409,
  payload_too_large: 413,
  internal: 500,
};

export interface ErrorBody {
  error: { code: ErrorCode; message: string; issues?: unknown[] };
}

export class AppError extends Error {
  constructor(
    public readonly code: ErrorCode,
    message: string,
    public readonly issues?: unknown[],
  ) {
    super(message);
    this.name = "AppError";
  }
  get status(): number {
    return STATUS[this.code];
  }
  toBody(): ErrorBody {
    return { error: { code: this.code, message: this.message, ...(this.issues ? { issues: this.issues } : {}) } };
  }
}

export const notSignedIn = () => new AppError("unauthenticated", "Sign in to continue.");
export const wrongRole = (need: string) => new AppError("forbidden", `This needs the ${need} role.`);
export const notFound = (what: string) => new AppError("not_found", `${what} not found.`);

/** Turn anything thrown into a JSON response; database details are logged, not returned. */
export function errorResponse(err: unknown): Response {
  if (err instanceof AppError) return Response.json(err.toBody(), { status: err.status });
  const guard = signedRecordGuard(err);
  if (guard) return Response.json(new AppError("conflict", guard).toBody(), { status: 409 });
  console.error("[plotproof] unexpected error", err);
  return Response.json(new AppError("internal", "Something went wrong on our side.").toBody(), { status: 500 });
}

/** The database's own refusal to change a signed record (triggers raise "plotproof: …"), as a sentence. */
function signedRecordGuard(err: unknown): string | null {
  for (
    let e = err as { message?: unknown; cause?: unknown } | undefined, depth = 0;
    e && depth < 4;
    e = e.cause as typeof e, depth++
  ) {
    const m = typeof e.message === "string" ? e.message.match(/plotproof: (.+)/) : null;
    if (m) return m[1].charAt(0).toUpperCase() + m[1].slice(1) + ".";
  }
  return null;
}
