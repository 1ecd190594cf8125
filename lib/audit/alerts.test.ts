import { describe, expect, it } from "vitest";
import { type AlertAuditFigures, type AlertThresholds, evaluateAlerts } from "./alerts";

const ALL: AlertThresholds = { armCrossOffsetM: 0.002, rmseRise: 0.3, failedVerdict: true };
const NONE: AlertThresholds = { armCrossOffsetM: null, rmseRise: null, failedVerdict: false };

function figures(over: Partial<AlertAuditFigures> = {}): AlertAuditFigures {
  return {
    arms: [
      { arm: "1", crossMean: 0.0004, crossSignificant: false, n: 40 },
      { arm: "3", crossMean: -0.0031, crossSignificant: true, n: 38 },
    ],
    rmseR: 0.013,
    passed: true,
    failedCriteria: [],
    ...over,
  };
}
const previous = { auditId: "a0", title: "April planting", basis: "machine" as const, rmseR: 0.01 };

describe("evaluateAlerts", () => {
  it("evaluateAlerts -- no thresholds set finds nothing, whatever the figures", () => {
    expect(evaluateAlerts(NONE, figures({ passed: false, rmseR: 1 }), previous)).toEqual([]);
  });

  it("evaluateAlerts -- a significant cross-row offset above the limit, by its size whatever its side", () => {
    const found = evaluateAlerts({ ...NONE, armCrossOffsetM: 0.002 }, figures(), null);
    expect(found).toHaveLength(1);
    expect(found[0].kind).toBe("arm-cross-offset");
    // |−3.1 mm| > 2.0 mm: arithmetic, worked by hand
    expect(found[0].detail).toEqual({ arms: "3", largestM: 0.0031, limitM: 0.002, everyArm: false });
    expect(found[0].message).toBe(
      "Mean cross-row error of arm 3 3.1 mm (records right of the plants, 38 fixed-fix checkpoints), above the 2.0 mm limit.",
    );
    const right = evaluateAlerts(
      { ...NONE, armCrossOffsetM: 0.002 },
      figures({ arms: [{ arm: "2", crossMean: 0.0025, crossSignificant: true, n: 20 }] }),
      null,
    );
    expect(right[0].message).toContain("records left of the plants");
    const noFix = evaluateAlerts(
      { ...NONE, armCrossOffsetM: 0.002 },
      figures({ arms: [{ arm: "2", crossMean: 0.0025, crossSignificant: true, n: 20, basis: "all" }] }),
      null,
    );
    expect(noFix[0].message).toContain("20 checkpoints, the records state no fix");
  });

  it("evaluateAlerts -- several arms over the limit make one finding; every arm over it points at a whole-pass shift", () => {
    const two = figures({
      arms: [
        { arm: "1", crossMean: 0.0004, crossSignificant: false, n: 40 },
        { arm: "2", crossMean: 0.0025, crossSignificant: true, n: 30 },
        { arm: "3", crossMean: -0.0031, crossSignificant: true, n: 38 },
      ],
    });
    const found = evaluateAlerts({ ...NONE, armCrossOffsetM: 0.002 }, two, null);
    expect(found).toHaveLength(1);
    expect(found[0].message).toBe(
      "Mean cross-row errors of arm 2 2.5 mm (records left of the plants, 30 fixed-fix checkpoints), arm 3 3.1 mm (records right of the plants, 38 fixed-fix checkpoints), above the 2.0 mm limit.",
    );
    expect(found[0].detail).toMatchObject({ arms: "2,3", everyArm: false });
    // A wrong reference frame: every arm off by metres
    const frame = figures({
      arms: ["1", "2"].map((arm) => ({ arm, crossMean: -230.85, crossSignificant: true, n: 40 })),
    });
    const shifted = evaluateAlerts({ ...NONE, armCrossOffsetM: 0.002 }, frame, null);
    expect(shifted[0].message).toBe(
      "Mean cross-row errors of arm 1 230.85 m (records right of the plants, 40 fixed-fix checkpoints), arm 2 230.85 m (records right of the plants, 40 fixed-fix checkpoints), above the 2.0 mm limit. Every arm is off, so a shift of the whole pass (base-station coordinates, reference frame) is more likely than the arms' calibration.",
    );
    expect(shifted[0].detail.everyArm).toBe(true);
  });

  it("evaluateAlerts -- an offset at the limit, or larger but not significant, is no alert", () => {
    const at = figures({ arms: [{ arm: "3", crossMean: -0.002, crossSignificant: true, n: 38 }] });
    expect(evaluateAlerts({ ...NONE, armCrossOffsetM: 0.002 }, at, null)).toEqual([]);
    const noise = figures({ arms: [{ arm: "3", crossMean: -0.004, crossSignificant: false, n: 3 }] });
    expect(evaluateAlerts({ ...NONE, armCrossOffsetM: 0.002 }, noise, null)).toEqual([]);
    const none = figures({ arms: [{ arm: "3", crossMean: null, crossSignificant: false, n: 0 }] });
    expect(evaluateAlerts({ ...NONE, armCrossOffsetM: 0.002 }, none, null)).toEqual([]);
  });

  it("evaluateAlerts -- RMSE up more than the share from the previous audit names it and its basis", () => {
    // 13 mm / 10 mm − 1 = 0.30 exactly (by hand): not above 30 %, above 25 %
    expect(evaluateAlerts({ ...NONE, rmseRise: 0.3 }, figures(), previous)).toEqual([]);
    const found = evaluateAlerts({ ...NONE, rmseRise: 0.25 }, figures(), previous);
    expect(found).toHaveLength(1);
    expect(found[0].kind).toBe("rmse-rise");
    expect(found[0].detail.relative).toBeCloseTo(0.3, 12);
    expect(found[0].detail).toMatchObject({ previousAuditId: "a0", basis: "machine", limit: 0.25 });
    expect(found[0].message).toBe(
      "Horizontal RMSE 13.0 mm is 30 % above the 10.0 mm of the previous audit of the same machine (“April planting”); the limit is 25 %.",
    );
  });

  it("evaluateAlerts -- no RMSE rise without a previous audit, with a previous RMSE of zero or without figures", () => {
    const t = { ...NONE, rmseRise: 0.1 };
    expect(evaluateAlerts(t, figures(), null)).toEqual([]);
    expect(evaluateAlerts(t, figures(), { ...previous, rmseR: 0 })).toEqual([]);
    expect(evaluateAlerts(t, figures(), { ...previous, rmseR: null })).toEqual([]);
    expect(evaluateAlerts(t, figures({ rmseR: null }), previous)).toEqual([]);
    // A fall is never a rise
    expect(evaluateAlerts(t, figures({ rmseR: 0.005 }), previous)).toEqual([]);
  });

  it("evaluateAlerts -- a failed verdict with its reasons; a passed or missing verdict is none", () => {
    const t = { ...NONE, failedVerdict: true };
    const found = evaluateAlerts(
      t,
      figures({ passed: false, failedCriteria: ["12 checkpoints; at least 30 needed."] }),
      null,
    );
    expect(found).toEqual([
      {
        kind: "failed-verdict",
        message: "The audit failed its tolerance profile. 12 checkpoints; at least 30 needed.",
        detail: { failedCriteria: 1 },
      },
    ]);
    expect(evaluateAlerts(t, figures({ passed: true }), null)).toEqual([]);
    expect(evaluateAlerts(t, figures({ passed: null }), null)).toEqual([]);
  });

  it("evaluateAlerts -- all thresholds at once come arms first, then RMSE, then verdict", () => {
    const found = evaluateAlerts(ALL, figures({ rmseR: 0.02, passed: false }), previous);
    expect(found.map((f) => f.kind)).toEqual(["arm-cross-offset", "rmse-rise", "failed-verdict"]);
  });

  it("evaluateAlerts -- refuses a threshold of zero or below; inputs are not modified", () => {
    expect(() => evaluateAlerts({ ...NONE, armCrossOffsetM: 0 }, figures(), null)).toThrow(
      "evaluateAlerts: armCrossOffsetM must be above 0 m, got 0",
    );
    expect(() => evaluateAlerts({ ...NONE, rmseRise: -1 }, figures(), null)).toThrow(
      "evaluateAlerts: rmseRise must be above 0, got -1",
    );
    const f = figures();
    const copy = structuredClone(f);
    evaluateAlerts(ALL, f, previous);
    expect(f).toEqual(copy);
  });
});
