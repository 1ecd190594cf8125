/** Shapes of the season view, shared by the server and the season charts (types only). */

/** One audit of the season: when its plants went in, its headline and per-arm figures. Metres. */
export interface SeasonPoint {
  auditId: string;
  title: string;
  /** The field the audit belongs to (a machine's season spans fields). */
  fieldName: string;
  state: string;
  /** Signed off (drawn solid) or not (hollow). */
  signed: boolean;
  passed: boolean | null;
  /** First planting day of the records (field's time zone), else the day the audit was computed; YYYY-MM-DD. */
  day: string;
  rmseR: number | null;
  arms: { arm: string | null; cross: number | null; along: number | null; significant: boolean }[];
}

export interface FieldSeason {
  field: { id: string; name: string; timeZone: string };
  points: SeasonPoint[];
}

export interface MachineSeason {
  machine: { id: string; name: string; toolArms: number };
  points: SeasonPoint[];
}
