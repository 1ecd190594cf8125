/** Per-pair error columns of one set of pairs (metres), shared by the headline statistics and every breakdown. */
export interface ErrorColumns {
  dE: Float64Array;
  dN: Float64Array;
  /** Along-row errors, or null without a row bearing. */
  along: Float64Array | null;
  /** Cross-row errors, or null without a row bearing. */
  cross: Float64Array | null;
  /** Radial errors sqrt(dE² + dN²). */
  radial: Float64Array;
  /** Within-tolerance flags, or null without limits. */
  within: Uint8Array | null;
}
