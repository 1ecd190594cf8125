import { z } from "zod";

/** The id of one of our own records (field, dataset, profile, preset, audit, API key): a uuid made by Postgres. */
export const RecordId = z.uuid();

/** An id better-auth makes for its own records (members, invitations): an opaque string, not a uuid. */
export const AuthRecordId = z.string().min(1).max(100);

/**
 * `params[key]` when it is a well-formed id, else null. Callers answer null with 404, as for another
 * organisation's record, so a malformed id and a foreign id cannot be told apart.
 */
export function idFromParams<K extends string>(
  params: Partial<Record<K, string | string[]>> | undefined,
  key: K,
  schema: z.ZodType<string> = RecordId,
): string | null {
  const parsed = schema.safeParse(params?.[key]);
  return parsed.success ? parsed.data : null;
}
