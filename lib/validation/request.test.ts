import { describe, expect, it } from "vitest";
import { z } from "zod";
import { AppError } from "@/lib/errors";
import { RecordId } from "./ids";
import { parseInput, readJsonBody, readQuery, routeId } from "./request";

const Body = z.object({ name: z.string().min(1, "Give it a name."), limits: z.object({ radialM: z.number() }) });

function thrown(fn: () => unknown): AppError {
  try {
    fn();
  } catch (err) {
    if (err instanceof AppError) return err;
    throw err;
  }
  throw new Error("expected an AppError");
}

async function rejected(p: Promise<unknown>): Promise<AppError> {
  try {
    await p;
  } catch (err) {
    if (err instanceof AppError) return err;
    throw err;
  }
  throw new Error("expected an AppError");
}

const post = (body: string) => new Request("http://x/api", { method: "POST", body });

describe("request", () => {
  it("parseInput -- valid input comes back parsed", () => {
    expect(parseInput(Body, { name: "A", limits: { radialM: 0.02 } }, "body")).toEqual({
      name: "A",
      limits: { radialM: 0.02 },
    });
  });

  it("parseInput -- 422 naming where and each field path, issues relative to the input", () => {
    const e = thrown(() => parseInput(Body, { name: "", limits: { radialM: "x" } }, "body"));
    expect(e.status).toBe(422);
    expect(e.code).toBe("invalid_input");
    expect(e.message).toMatch(/^body\.name: Give it a name\.; body\.limits\.radialM: /);
    expect(e.issues).toEqual([
      { path: ["name"], message: "Give it a name." },
      { path: ["limits", "radialM"], message: expect.any(String) },
    ]);
  });

  it("parseInput -- a failure of the whole input names the place alone", () => {
    expect(thrown(() => parseInput(Body, [], "form")).message).toMatch(/^form: /);
  });

  it("readJsonBody -- not JSON, and an empty body, are 422 unless the body is optional", async () => {
    expect((await rejected(readJsonBody(post("{"), Body))).message).toBe("The request body is not valid JSON.");
    expect((await rejected(readJsonBody(post(""), Body))).status).toBe(422);
    expect(await readJsonBody(post(" "), z.object({ note: z.string().optional() }), { optional: true })).toEqual({});
    expect((await rejected(readJsonBody(post("{"), Body, { optional: true }))).status).toBe(422);
  });

  it("readQuery -- coerces from the query string and names the parameter on failure", () => {
    const Q = z.object({ page: z.coerce.number().int().min(1) });
    expect(readQuery(new Request("http://x/api?page=3"), Q)).toEqual({ page: 3 });
    expect(thrown(() => readQuery(new Request("http://x/api?page=0"), Q)).message).toMatch(/^query\.page: /);
  });

  it("routeId -- a malformed id is 404 like a foreign one, never 422", () => {
    const id = "0b7c6f1e-3f43-4d0e-9a51-6f1d2f7e8a90";
    expect(RecordId.safeParse(id).success).toBe(true);
    expect(routeId({ id }, "id", "Audit")).toBe(id);
    const e = thrown(() => routeId({ id: "not-a-uuid" }, "id", "Audit"));
    expect([e.status, e.message]).toEqual([404, "Audit not found."]);
    expect(routeId({ memberId: "k3Jx9" }, "memberId", "Member", z.string().min(1))).toBe("k3Jx9");
  });
});
