/** A synthetic as-planted file of `rows` plants on straight rows at Kestrel Fen (WGS 84), without problems. */
export function bigAsPlanted(rows: number): Buffer {
  const lines = ["plant_id,crop,bed,row,arm,fix,hdop,planted_at,lat,lon"];
  const t0 = Date.parse("2026-04-14T21:40:00Z");
  const mPerDegLat = 111_320,
    mPerDegLon = 111_320 * Math.cos((52.5178 * Math.PI) / 180);
  for (let i = 0; i < rows; i++) {
    const bed = Math.floor(i / 5000) + 1,
      row = (Math.floor(i / 1000) % 5) + 1,
      k = i % 1000;
    const lat = 52.5178 + (k * 0.3) / mPerDegLat;
    const lon = 5.3936 + ((bed - 1) * 3 + (row - 1) * 0.5) / mPerDegLon;
    lines.push(
      `KF-${String(i + 1).padStart(6, "0")},lettuce,${bed},${row},${(row % 3) + 1},rtk-fixed,0.7,${new Date(t0 + i * 1300).toISOString()},${lat.toFixed(9)},${lon.toFixed(9)}`,
    );
  }
  return Buffer.from(lines.join("\n") + "\n");
}
