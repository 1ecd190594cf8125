import proj4 from "proj4";
import { resolveCrs } from "./registry";

/** Reads a numeric +name=value parameter of a proj string (NaN when absent or not a number). */
function param(spec: string, name: string): number {
  const m = new RegExp(`\\+${name}=([^\\s]+)`).exec(spec);
  return m ? Number(m[1]) : NaN;
}

/**
 * Why a CRS a field is set up with cannot be used, or null when it can. An EPSG code must be one of the
 * bundled ones; a proj string must be understood by proj4 and must carry a test point near its own origin
 * (the central meridian and latitude of origin, or the UTM zone's central meridian at 45°) to finite
 * coordinates and back to within 1e-6°. UTM zones run from 1 to 60 (6° zones; DMA TM 8358.2, from memory).
 *
 * @example crsProblem("+proj=utm +zone=999") // "UTM zones run from 1 to 60; +zone=999 is not one"
 * @example crsProblem("EPSG:25832") // null
 */
export function crsProblem(spec: string): string | null {
  const s = spec.trim();
  if (!s.startsWith("+")) {
    try {
      resolveCrs(s);
      return null;
    } catch (e) {
      return (e as Error).message.replace(/^unknown CRS/, "Unknown CRS");
    }
  }
  const proj = /\+proj=(\w+)/.exec(s)?.[1];
  if (!proj) return "A proj string needs +proj=…, e.g. +proj=utm +zone=32 +datum=WGS84.";
  let lon = Number.isFinite(param(s, "lon_0")) ? param(s, "lon_0") : 0;
  let lat = Number.isFinite(param(s, "lat_0")) ? param(s, "lat_0") : 0;
  if (proj === "utm") {
    const zoneText = /\+zone=([^\s]+)/.exec(s)?.[1];
    const zone = Number(zoneText);
    if (zoneText === undefined) return "A UTM proj string needs its zone, e.g. +proj=utm +zone=32.";
    if (!Number.isInteger(zone) || zone < 1 || zone > 60)
      return `UTM zones run from 1 to 60; +zone=${zoneText} is not one.`;
    lon = zone * 6 - 183;
    lat = /\+south\b/.test(s) ? -45 : 45;
  }
  lat = Math.max(-80, Math.min(80, lat));
  const point: [number, number] = [lon + 0.5, lat + 0.5];
  try {
    const conv = proj4("+proj=longlat +datum=WGS84 +no_defs", s);
    const out = conv.forward(point);
    const back = conv.inverse(out);
    if (!out.every(Number.isFinite) || !back.every(Number.isFinite))
      return `The proj string "${s}" does not project a test point (${point[1]}°, ${point[0]}°) to finite coordinates; check its parameters.`;
    if (Math.abs(back[0] - point[0]) > 1e-6 || Math.abs(back[1] - point[1]) > 1e-6)
      return `The proj string "${s}" does not bring a test point (${point[1]}°, ${point[0]}°) back to where it started; check its parameters.`;
  } catch (e) {
    const why = e instanceof Error && e.message ? `: ${e.message}` : "";
    return `proj4 cannot use the proj string "${s}"${why}. Check the projection name and its parameters.`;
  }
  return null;
}
