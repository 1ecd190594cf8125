import { describe, expect, it } from "vitest";
import { groupRowTrust, groupStatistics } from "./groups";
import { RECORD_CLASS, RECORD_REASON, recordTrust, type RecordTrustInput, type StratumDimension } from "./record-trust";

const hoeing = { requiredShare: 0.95, confidence: 0.95, radialM: null, crossM: 0.02, alongM: null };

/** A field of records with strata as text; `checked` records have a checkpoint with the given cross-row error. */
function field(
  records: { fix: string; arm: string; day?: string; bed: string; row: string }[],
  checked: { record: number; cross: number }[],
  profile = hoeing,
): RecordTrustInput {
  const dims: StratumDimension[] = ["fix", "arm", "day", "bedRow"];
  const text = (r: (typeof records)[number], d: StratumDimension) =>
    d === "bedRow" ? `${r.bed}/${r.row}` : d === "day" ? (r.day ?? "") : r[d];
  const strata = dims.map((d) => {
    const values = [...new Set(records.map((r) => text(r, d)).filter((v) => v !== ""))];
    const code = (r: (typeof records)[number]) => values.indexOf(text(r, d));
    return {
      dimension: d,
      values,
      recordCodes: Int32Array.from(records, code),
      pairCodes: Int32Array.from(checked, (c) => code(records[c.record])),
    };
  });
  const limit = profile.crossM ?? Number.POSITIVE_INFINITY;
  return {
    recordCount: records.length,
    pairs: {
      within: Int8Array.from(checked, (c) => (Math.abs(c.cross) <= limit ? 1 : 0)),
      radial: Float64Array.from(checked, (c) => Math.abs(c.cross)),
      cross: Float64Array.from(checked, (c) => c.cross),
      along: Float64Array.from(checked, () => Number.NaN),
      record: Int32Array.from(checked, (c) => c.record),
    },
    strata,
    profile,
  };
}

/** Two beds × two rows (arm = row) of `perRow` records; in bed 2 row 2 records from `floatFrom` on are float. */
function farm(perRow: number, floatFrom: number) {
  const records: { fix: string; arm: string; day: string; bed: string; row: string }[] = [];
  for (const bed of ["1", "2"])
    for (const row of ["1", "2"])
      for (let k = 0; k < perRow; k++)
        records.push({
          fix: bed === "2" && row === "2" && k >= floatFrom ? "rtk-float" : "rtk-fixed",
          arm: row,
          day: "2026-04-14",
          bed,
          row,
        });
  return records;
}

describe("recordTrust", () => {
  it("record trust -- a float stretch that also drags its arm down condemns the float records only", () => {
    const records = farm(200, 100);
    // Every 2nd record checked: 400 fixed checkpoints within (3 mm), 50 float checkpoints of which 40 out (30 mm).
    const checked = records
      .map((r, i) => ({ r, i }))
      .filter(({ i }) => i % 2 === 0)
      .map(({ r, i }) => ({ record: i, cross: r.fix === "rtk-float" ? (i % 10 < 8 ? 0.03 : 0.004) : 0.003 }));
    const t = recordTrust(field(records, checked));
    // The float stratum (share 10/50) is named before arm 2 (share 90/150), which then meets without it.
    expect(t.named.map((n) => `${n.dimension} ${n.key}`)).toEqual(["fix rtk-float"]);
    const arm2 = t.strata.find((s) => s.dimension === "arm" && s.key === "2")!;
    expect(arm2.initial.word).toBe("does not meet");
    expect(arm2.trust.word).toBe("meets");
    expect(t.counts).toEqual({ rely: 700, "do not rely": 100, "not yet shown": 0 });
    for (let r = 0; r < records.length; r++)
      expect(t.recordClass[r]).toBe(records[r].fix === "rtk-float" ? RECORD_CLASS.DO_NOT_RELY : RECORD_CLASS.RELY);
    expect(t.recordReason[records.findIndex((r) => r.fix === "rtk-float")]).toBe(0);
    // The remainder: 350 checkpoints all within; one-sided bound 0.05^(1/350) ≥ 0.95 — Collins, ARL-TR-5214 (2010)
    expect(t.remainder?.word).toBe("meets");
    expect(t.remainder?.n).toBe(350);
  });

  it("record trust -- a bed × row with errors of its own is named after the causes", () => {
    const records = farm(200, 200); // no float at all
    const checked = records
      .map((_, i) => i)
      .filter((i) => i % 2 === 0)
      .map((i) => ({
        record: i,
        cross: records[i].bed === "1" && records[i].row === "2" && i % 20 === 0 ? 0.05 : 0.002,
      }));
    const t = recordTrust(field(records, checked));
    expect(t.named.map((n) => `${n.dimension} ${n.key}`)).toEqual(["bedRow 1/2"]);
    expect(t.named[0].namedInRound).toBe(1);
    expect(t.counts["do not rely"]).toBe(200);
    expect(t.counts.rely).toBe(600);
  });

  it("record trust -- too few checkpoints leave the records not yet shown, and say how many more", () => {
    const records = farm(20, 20);
    // 58 checkpoints, all within: one short of 0.05^(1/59) ≥ 0.95 — Turpin et al., modified rule of three
    const checked = Array.from({ length: 58 }, (_, i) => ({ record: i, cross: 0.001 }));
    const t = recordTrust(field(records, checked));
    expect(t.remainder?.word).toBe("not enough evidence yet");
    expect(t.remainder?.moreNeeded).toBe(1);
    expect(t.counts["not yet shown"]).toBe(80);
  });

  it("record trust -- a planting day no checkpoint shares is not yet shown, whatever the rest says", () => {
    const records = farm(40, 40).map((r, i) => ({ ...r, day: i < 120 ? "2026-04-14" : "2026-04-15" }));
    const checked = Array.from({ length: 60 }, (_, i) => ({ record: i * 2, cross: 0.001 }));
    const t = recordTrust(field(records, checked));
    expect(t.remainder?.word).toBe("meets");
    expect(t.untested).toEqual([{ dimension: "day", key: "2026-04-15", records: 40 }]);
    expect(t.counts).toEqual({ rely: 120, "do not rely": 0, "not yet shown": 40 });
    expect(t.recordReason[150]).toBe(RECORD_REASON.UNTESTED);
  });

  it("record trust -- a checkpoint out where no stratum fails marks its own record", () => {
    const records = farm(200, 200);
    // One checkpoint out of 40 in its bed × row (share 0.975 ≥ 0.95, so no stratum "does not meet").
    const checked = records.map((_, i) => ({ record: i, cross: i === 7 ? 0.05 : 0.001 })).filter((_, i) => i % 5 === 2);
    const t = recordTrust(field(records, checked));
    expect(t.named).toEqual([]);
    expect(t.recordClass[7]).toBe(RECORD_CLASS.DO_NOT_RELY);
    expect(t.recordReason[7]).toBe(RECORD_REASON.OWN_CHECKPOINT);
    expect(t.counts["do not rely"]).toBe(1);
  });

  it("record trust -- errors everywhere and no single cause: nothing to rely on", () => {
    const records = farm(50, 50);
    const checked = records.map((_, i) => ({ record: i, cross: i % 4 === 0 ? 0.03 : 0.001 }));
    const t = recordTrust(field(records, checked));
    expect(t.counts["do not rely"]).toBe(200);
  });

  it("record trust -- a stratum's first judgement is the word its breakdown row gets", () => {
    const records = farm(200, 100);
    const checked = records
      .map((r, i) => ({ r, i }))
      .filter(({ i }) => i % 3 === 0)
      .map(({ r, i }) => ({ record: i, cross: r.fix === "rtk-float" && i % 2 === 0 ? 0.03 : 0.002 }));
    const input = field(records, checked);
    const t = recordTrust(input);
    const fix = input.strata.find((s) => s.dimension === "fix")!;
    const rows = groupStatistics(
      fix.pairCodes,
      fix.values,
      {
        dE: input.pairs.cross as Float64Array,
        dN: new Float64Array(checked.length),
        along: null,
        cross: input.pairs.cross as Float64Array,
        radial: input.pairs.radial as Float64Array,
        within: Uint8Array.from(input.pairs.within),
      },
      0.95,
    );
    for (const row of rows) {
      const s = t.strata.find((x) => x.dimension === "fix" && x.key === row.key)!;
      expect(s.initial.word).toBe(groupRowTrust(row, hoeing)?.word);
    }
  });

  it("record trust -- refuses columns of different lengths", () => {
    const input = field(farm(2, 2), [{ record: 0, cross: 0.001 }]);
    expect(() => recordTrust({ ...input, recordCount: 3 })).toThrow(/record codes/);
  });
});
