"use client";
import type { ErrorBody } from "@/lib/errors";

/** Error thrown by `fetcher` with the API's own code, message and issues. */
export class ApiError extends Error {
  constructor(
    public readonly status: number,
    public readonly code: string,
    message: string,
    public readonly issues?: unknown[],
  ) {
    super(message);
  }
}

/** SWR fetcher: JSON or an ApiError carrying the body's error. */
export async function fetcher<T>(url: string): Promise<T> {
  const res = await fetch(url, { headers: { accept: "application/json" } });
  if (!res.ok) throw await toApiError(res);
  return res.json() as Promise<T>;
}

/** Send JSON (POST/PATCH/DELETE) and return the parsed answer or throw an ApiError. */
export async function sendJson<T>(
  url: string,
  method: "POST" | "PATCH" | "PUT" | "DELETE",
  body?: unknown,
): Promise<T> {
  const res = await fetch(url, {
    method,
    headers: { accept: "application/json", ...(body === undefined ? {} : { "content-type": "application/json" }) },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  if (!res.ok) throw await toApiError(res);
  return (res.status === 204 ? undefined : await res.json()) as T;
}

export async function toApiError(res: Response): Promise<ApiError> {
  try {
    const body = (await res.json()) as ErrorBody;
    return new ApiError(res.status, body.error.code, body.error.message, body.error.issues);
  } catch {
    return new ApiError(res.status, "internal", `Request failed (${res.status}).`);
  }
}
