import type { z } from "zod";
import { AppError, notFound } from "@/lib/errors";
import { idFromParams, RecordId } from "@/lib/validation/ids";

/** Where an input came from; named in the 422 message so the caller knows which part of the request to fix. */
export type InputPlace = "body" | "query" | "form";

/**
 * The one zod check at the edge: `value` parsed with `schema`, or a 422 `AppError("invalid_input")` whose message
 * names each field path and what is wrong with it (`body.comment: Say what needs correcting …`) and whose issues
 * are `{ path, message }` (paths relative to `where`, as the forms expect them).
 */
export function parseInput<T extends z.ZodType>(schema: T, value: unknown, where: InputPlace): z.output<T> {
  const result = schema.safeParse(value);
  if (result.success) return result.data;
  const issues = result.error.issues.map((i) => ({ path: i.path, message: i.message }));
  const message = issues.map((i) => `${[where, ...i.path.map(String)].join(".")}: ${i.message}`).join("; ");
  throw new AppError("invalid_input", message, issues);
}

/** The JSON body parsed with `schema` (422 otherwise); with `optional`, an empty body counts as `{}`. */
export async function readJsonBody<T extends z.ZodType>(
  req: Request,
  schema: T,
  opts: { optional?: boolean } = {},
): Promise<z.output<T>> {
  const text = await req.text();
  let body: unknown = {};
  if (text.trim() !== "" || !opts.optional) {
    try {
      body = JSON.parse(text);
    } catch {
      throw new AppError("invalid_input", "The request body is not valid JSON.");
    }
  }
  return parseInput(schema, body, "body");
}

/** The query string parsed with `schema` (422 otherwise); each parameter once, as a string. */
export function readQuery<T extends z.ZodType>(req: Request, schema: T): z.output<T> {
  return parseInput(schema, Object.fromEntries(new URL(req.url).searchParams), "query");
}

/**
 * The id in a route parameter, or 404 "`what` not found." when it is malformed — the same answer as for another
 * organisation's record, so a probe learns nothing. `schema` is `RecordId` unless the id is better-auth's.
 */
export function routeId<K extends string>(
  params: Partial<Record<K, string | string[]>> | undefined,
  key: K,
  what: string,
  schema: z.ZodType<string> = RecordId,
): string {
  const id = idFromParams(params, key, schema);
  if (id === null) throw notFound(what);
  return id;
}
