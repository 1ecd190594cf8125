import { describe, expect, it } from "vitest";
import { storageChoice } from "./config";

const store = {
  OBJECT_STORE_URL: "http://127.0.0.1:9000",
  OBJECT_STORE_BUCKET: "plotproof",
  OBJECT_STORE_ACCESS_KEY: "key",
  OBJECT_STORE_SECRET_KEY: "secret",
};

describe("storageChoice", () => {
  it("storageChoice -- embedded mode keeps files in the database, even with an object store configured", () => {
    expect(storageChoice({})).toEqual({ kind: "database" });
    expect(storageChoice({ ...store })).toEqual({ kind: "database" });
  });
  it("storageChoice -- server mode without an object store keeps files in PostgreSQL", () => {
    expect(storageChoice({ DATABASE_URL: "postgres://db/plotproof" })).toEqual({ kind: "database" });
  });
  it("storageChoice -- server mode with an object store uses it (region us-east-1 unless given)", () => {
    expect(storageChoice({ DATABASE_URL: "postgres://db/plotproof", ...store })).toEqual({
      kind: "object-store",
      config: {
        url: "http://127.0.0.1:9000",
        bucket: "plotproof",
        region: "us-east-1",
        accessKeyId: "key",
        secretAccessKey: "secret",
      },
    });
  });
  it("storageChoice -- a half-configured object store names what is missing", () => {
    const { OBJECT_STORE_BUCKET: _, OBJECT_STORE_SECRET_KEY: __, ...half } = store;
    expect(() => storageChoice({ DATABASE_URL: "postgres://db/plotproof", ...half })).toThrow(
      "Object store settings: OBJECT_STORE_BUCKET is required with OBJECT_STORE_URL; OBJECT_STORE_SECRET_KEY is required with OBJECT_STORE_URL.",
    );
    expect(() =>
      storageChoice({ DATABASE_URL: "postgres://db/plotproof", ...store, OBJECT_STORE_BUCKET: "Bad_Name" }),
    ).toThrow("OBJECT_STORE_BUCKET must be a bucket name");
  });
});
