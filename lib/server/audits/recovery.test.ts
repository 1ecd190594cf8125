import { describe, expect, it } from "vitest";
import { RESUME_LIMIT, recoveryDecision } from "./recovery";

describe("recoveryDecision", () => {
  it("recoveryDecision -- resumes an audit interrupted for the first and second time", () => {
    expect(RESUME_LIMIT).toBe(2);
    expect(recoveryDecision({ stage: "pairing", resumptions: 0 })).toEqual({ kind: "resume", resumption: 1 });
    expect(recoveryDecision({ stage: "saving", resumptions: 1 })).toEqual({ kind: "resume", resumption: 2 });
  });

  it("recoveryDecision -- fails it, with the stage in plain words, after two resumptions that died again", () => {
    expect(recoveryDecision({ stage: "saving", resumptions: 2 })).toEqual({
      kind: "fail",
      times: 3,
      error:
        "The server stopped while this audit was computing (stage: saving the results), 3 times; it was not started again. " +
        "Very large files can need more memory than the server has: check the two files, then compute it again.",
    });
    const odd = recoveryDecision({ stage: "something-new", resumptions: 5 });
    expect(odd).toMatchObject({ kind: "fail", times: 6 });
    expect(odd.kind === "fail" && odd.error).toMatch(/^The server stopped .*\(stage: something-new\), 6 times;/);
  });
});
