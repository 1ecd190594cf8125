import "server-only";
import type { z } from "zod";
import { AppError } from "@/lib/errors";

/** Parse a JSON body with zod (422 with the issues); an empty body counts as `{}` when `optional`. */
export async function readBody<T extends z.ZodType>(
  req: Request,
  schema: T,
  opts: { optional?: boolean } = {},
): Promise<z.infer<T>> {
  const text = await req.text();
  let body: unknown = {};
  if (text.trim() !== "" || !opts.optional) {
    try {
      body = JSON.parse(text);
    } catch {
      throw new AppError("invalid_input", "The request body is not valid JSON.");
    }
  }
  const result = schema.safeParse(body);
  if (!result.success) {
    const issues = result.error.issues.map((i) => ({ path: i.path, message: i.message }));
    throw new AppError("invalid_input", issues.map((i) => i.message).join(" "), issues);
  }
  return result.data;
}
