import type { PointTable } from "./types";

/**
 * The distinct ArrayBuffers behind a table's typed arrays, for moving the table to another thread
 * without copying (`postMessage(table, tableBuffers(table))`; the sender's arrays become unusable).
 * @example tableBuffers(table).length // x, y, line, … each own buffer
 */
export function tableBuffers(t: PointTable): ArrayBuffer[] {
  const arrays: (ArrayBufferView | null)[] = [
    t.x,
    t.y,
    t.line,
    t.time,
    t.hdop,
    t.precision,
    t.rawX,
    t.rawY,
    t.id?.codes ?? null,
    t.id?.offsets ?? null,
  ];
  for (const c of Object.values(t.attrs)) if (c) arrays.push(c.codes);
  const seen = new Set<ArrayBuffer>();
  for (const a of arrays) if (a && a.buffer instanceof ArrayBuffer) seen.add(a.buffer);
  return [...seen];
}
