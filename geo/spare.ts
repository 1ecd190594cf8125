/**
 * Arrays handed out with spare room behind them. A reader's column arrays grow by doubling; instead
 * of copying them to their exact length, it hands out views and records their buffers here, so that
 * appending a second part of the file (read on another thread) can fill that room instead of
 * allocating and copying tens of megabytes again. Only buffers recorded here are ever written past
 * the view, and each at most once.
 */
type Growable = Float64Array | Int32Array | Uint8Array | Uint16Array;

const spare = new WeakSet<ArrayBufferLike>();

/** The first `n` elements of `full` as a view; the rest of its buffer may be used by `appendTo`. */
export function viewWithRoom<T extends Growable>(full: T, n: number): T {
  spare.add(full.buffer);
  return full.subarray(0, n) as T;
}

/**
 * An array of `a.length + extra` elements starting with `a`, whose last `extra` elements the caller
 * fills: in `a`'s own buffer when it has room recorded by `viewWithRoom` (the contents of `a` are
 * not changed), else a new array.
 * @example const out = appendTo(a, b.length); out.set(b, a.length);
 */
export function appendTo<T extends Growable>(a: T, extra: number): T {
  const n = a.length + extra;
  const buf = a.buffer;
  const Ctor = a.constructor as new (...args: unknown[]) => T;
  if (spare.has(buf) && a.byteOffset === 0 && buf.byteLength >= n * a.BYTES_PER_ELEMENT) {
    spare.delete(buf);
    return new Ctor(buf, 0, n);
  }
  const out = new Ctor(n);
  out.set(a);
  return out;
}
