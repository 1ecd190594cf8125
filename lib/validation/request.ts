import type { z } from "zod";
import { AppError } from "@/lib/errors";

/** Parse a JSON request body with a zod schema; 422 with the issues (path + message) otherwise. */
export async function parseJsonBody<T extends z.ZodType>(req: Request, schema: T): Promise<z.infer<T>> {
  let body: unknown;
  try {
    body = await req.json();
  } catch {
    throw new AppError("invalid_input", "The request body is not valid JSON.");
  }
  const result = schema.safeParse(body);
  if (!result.success) {
    const issues = result.error.issues.map((i) => ({ path: i.path, message: i.message }));
    throw new AppError("invalid_input", `Invalid ${issues.map((i) => i.path.join(".") || "body").join(", ")}.`, issues);
  }
  return result.data;
}
