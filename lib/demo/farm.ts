/**
 * The demo scenario: a fictional farm business, Kestrel Fen Growers, on reclaimed fenland in eastern England
 * (ETRS89 / UTM 31N, Europe/London), and a fictional contractor used to show that organisations are kept apart.
 * Everything here is invented for the demo.
 */

export const DEMO_PASSWORD = "kestrel-demo-26";

export const DEMO_ORG = { name: "Kestrel Fen Growers", kind: "farm" as const };
export const OTHER_ORG = { name: "Saltings Field Services", kind: "contractor" as const };

export const DEMO_PEOPLE = [
  { role: "owner", name: "Maren Holt", email: "maren@kestrelfen.example" },
  { role: "qa_lead", name: "Idris Coombe", email: "idris@kestrelfen.example" },
  { role: "technician", name: "Tamsin Rook", email: "tamsin@kestrelfen.example" },
  { role: "grower", name: "Ansel Brookes", email: "ansel@kestrelfen.example" },
] as const;

export const OTHER_OWNER = { role: "owner", name: "Corin Dale", email: "corin@saltings.example" } as const;

/** Work CRS of the farm: ETRS89 / UTM zone 31N. */
export const DEMO_CRS = "EPSG:25831";
export const DEMO_TIME_ZONE = "Europe/London";

export interface DemoFieldSpec {
  name: string;
  farm: string;
  crop: string;
  /** South-west corner of the first row, ETRS89 / UTM 31N metres. */
  originE: number;
  originN: number;
  /** Row direction, degrees clockwise from grid north. */
  bearingDeg: number;
  beds: number;
  rowsPerBed: number;
  rowSpacingM: number;
  bedSpacingM: number;
  plantSpacingM: number;
  plantsPerRow: number;
  /** Every n-th plant of each row is surveyed as a checkpoint. */
  surveyEvery: number;
  /** Planting start, UTC. */
  startUtc: string;
  /** Seconds between plants placed by one arm. */
  secondsPerPlant: number;
  idPrefix: string;
  seed: number;
  /** A whole-pass shift of the records (e.g. wrong base-station coordinates that day), metres; default none. */
  shiftE?: number;
  shiftN?: number;
}

export const DEMO_FIELDS: DemoFieldSpec[] = [
  {
    name: "Long Acre",
    farm: "Kestrel Fen",
    crop: "lettuce",
    originE: 317_960,
    originN: 5_816_690,
    bearingDeg: 22.5,
    beds: 6,
    rowsPerBed: 5,
    rowSpacingM: 0.5,
    bedSpacingM: 3.0,
    plantSpacingM: 0.3,
    plantsPerRow: 160,
    surveyEvery: 12,
    startUtc: "2026-04-14T22:40:00Z",
    secondsPerPlant: 2.6,
    idPrefix: "LA",
    seed: 20260414,
  },
  {
    name: "Willow Strip",
    farm: "Kestrel Fen",
    crop: "celeriac",
    originE: 320_620,
    originN: 5_814_920,
    bearingDeg: 112,
    beds: 4,
    rowsPerBed: 4,
    rowSpacingM: 0.4,
    bedSpacingM: 3.0,
    plantSpacingM: 0.35,
    plantsPerRow: 120,
    surveyEvery: 10,
    startUtc: "2026-05-02T06:30:00Z",
    secondsPerPlant: 3.1,
    idPrefix: "WS",
    seed: 20260502,
  },
];

export const OTHER_FIELD = {
  name: "Saltings Trial Plot",
  farm: "Saltings",
  crs: "EPSG:25831",
  timeZone: "Europe/London",
};
