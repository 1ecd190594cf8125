import { describe, expect, it } from "vitest";
import { crsProblem } from "./check";

// UTM zone numbering 1–60: DMA TM 8358.2 (1989), from memory. Round trips are checked with proj4js itself.
describe("crsProblem", () => {
  it("crsProblem -- bundled EPSG codes and sound proj strings pass", () => {
    expect(crsProblem("EPSG:25831")).toBeNull();
    expect(crsProblem("+proj=utm +zone=31 +datum=WGS84 +units=m +no_defs")).toBeNull();
    expect(crsProblem("+proj=utm +zone=59 +south +datum=WGS84")).toBeNull();
    expect(crsProblem("+proj=tmerc +lat_0=0 +lon_0=9 +k=0.9996 +x_0=500000 +ellps=GRS80")).toBeNull();
    expect(crsProblem("+proj=longlat +datum=WGS84")).toBeNull();
  });

  it("crsProblem -- a UTM zone outside 1–60 is refused naming the zone", () => {
    expect(crsProblem("+proj=utm +zone=999")).toBe("UTM zones run from 1 to 60; +zone=999 is not one.");
    expect(crsProblem("+proj=utm +zone=0")).toContain("+zone=0");
    expect(crsProblem("+proj=utm +datum=WGS84")).toContain("needs its zone");
  });

  it("crsProblem -- an unknown projection or EPSG code is refused", () => {
    expect(crsProblem("+proj=nosuchthing +lon_0=3")).toContain("proj4 cannot use");
    expect(crsProblem("EPSG:99999")).toContain("Unknown CRS");
  });
});
