/** Shapes of survey plans, control marks and survey records as the API returns them. Types only. */
import type { SampleSize, StandardName } from "./sample-size";
import type { StratumAttribute, StratumPlan } from "./select";
import type { Coverage, MissingStatus } from "./coverage";
import type { InstrumentCheck } from "./instrument-check";

export interface PlanParameters {
  allowedFailures: number;
  standards: StandardName[];
  strataBy: StratumAttribute[];
  minPerStratum: number;
  sparesPerStratum: number;
  minSpacingM: number;
  bedEndM: number;
  /** The bearing the planner gave; null = the field's, else the points' main direction. */
  rowBearingDeg: number | null;
}

export interface PlanProfileCopy {
  id: string | null;
  name: string;
  operation: string;
  radialM: number | null;
  crossM: number | null;
  alongM: number | null;
  requiredShare: number;
  confidence: number;
  minCheckpoints: number;
}

export interface PlanPointDto {
  seq: number;
  name: string;
  plantId: string;
  stratum: string;
  spare: boolean;
  e: number;
  n: number;
  crop: string | null;
  bed: string | null;
  row: string | null;
  arm: string | null;
}

export interface SurveyPlanDto {
  id: string;
  fieldId: string;
  fieldName: string;
  fieldCrs: string;
  plantedDatasetId: string;
  plantedFileName: string;
  name: string;
  profile: PlanProfileCopy;
  parameters: PlanParameters;
  seed: number;
  sampleSize: SampleSize;
  strata: StratumPlan[];
  selectionNotes: {
    excludedAtBedEnds: number;
    eligible: number;
    bearingDeg: number;
    sparesShort: number;
    plants: number;
  };
  checkpoints: number;
  spares: number;
  createdByName: string;
  createdAt: string;
  /** Surveys uploaded against this plan; a used plan can no longer change. */
  usedBy: number;
}

export interface SurveyPlanWithPoints extends SurveyPlanDto {
  points: PlanPointDto[];
}

export interface ControlMarkDto {
  id: string;
  fieldId: string;
  name: string;
  e: number;
  n: number;
  h: number | null;
  description: string | null;
  source: string | null;
  updatedAt: string;
}

export interface MarkCheckRecord {
  mark: { id: string; name: string; e: number; n: number; h: number | null };
  before: { e: number; n: number; h: number | null };
  after: { e: number; n: number; h: number | null } | null;
}

export interface SurveyRecordDto {
  datasetId: string;
  planId: string | null;
  planName: string | null;
  markCheck: MarkCheckRecord | null;
  instrumentCheck: InstrumentCheck | null;
  instrument: string | null;
  serial: string | null;
  calibrationDate: string | null;
  precisionMm: number | null;
  surveyor: string | null;
  method: string | null;
  /** Points reported dead or not found: by the file's status column (with its line) and the upload form. */
  missingReported: { name: string; status: MissingStatus; line?: number }[];
  coverage: Coverage | null;
  createdAt: string;
}

/** Unpaired counts of an audit split by its survey's plan (null plan: no split, today's three lists). */
export interface UnpairedSplitDto {
  planId: string | null;
  planName: string | null;
  notSampled: number;
  sampledNotFound: number;
  surveyedNoRecord: number;
  ambiguous: number;
}
