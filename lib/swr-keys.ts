/** SWR keys are the API URLs; build them only here. `null` means "not yet". */
import type { ResidualSort } from "@/lib/validation/audit";

const qs = (params: Record<string, string | number | boolean | undefined | null>) => {
  const s = new URLSearchParams();
  for (const [k, v] of Object.entries(params)) if (v !== undefined && v !== null && v !== "") s.set(k, String(v));
  const str = s.toString();
  return str ? `?${str}` : "";
};

export const keys = {
  fields: () => "/api/fields",
  field: (fieldId: string) => `/api/fields/${fieldId}`,
  fieldDerived: (fieldId: string) => `/api/fields/${fieldId}/derived`,
  fieldDatasets: (fieldId: string) => `/api/fields/${fieldId}/datasets`,
  dataset: (datasetId: string) => `/api/datasets/${datasetId}`,
  crs: (q: string) => `/api/crs${qs({ q })}`,
  presets: (kind?: "planted" | "survey") => `/api/presets${qs({ kind })}`,
  profiles: () => "/api/profiles",
  profile: (id: string) => `/api/profiles/${id}`,
  audits: (fieldId?: string) => `/api/audits${qs({ fieldId })}`,
  audit: (auditId: string) => `/api/audits/${auditId}`,
  auditSummary: (auditId: string) => `/api/audits/${auditId}/summary`,
  auditResiduals: (auditId: string, p: ResidualQuery) => `/api/audits/${auditId}/residuals${qs({ ...p })}`,
  auditUnpaired: (auditId: string, p: { kind?: string; page?: number; pageSize?: number }) =>
    `/api/audits/${auditId}/unpaired${qs(p)}`,
  auditChartData: (auditId: string) => `/api/audits/${auditId}/chart-data`,
  auditCsv: (auditId: string, kind: "residuals" | "summary" | "unpaired") => `/api/audits/${auditId}/${kind}.csv`,
  apiKeys: () => "/api/keys",
  // Machines and alerts (issue 13)
  machines: () => "/api/machines",
  machine: (id: string) => `/api/machines/${id}`,
  machineSeason: (id: string) => `/api/machines/${id}/season`,
  alertRules: () => "/api/alerts/rules",
  alerts: (open?: boolean) => `/api/alerts${qs({ open: open ? "true" : undefined })}`,
  alert: (id: string) => `/api/alerts/${id}`,
  // Survey plans (issue 12)
  planRecords: (planId: string) => `/api/plans/${planId}/records`,
};

/** Server-side paging, sorting and filtering of per-plant residuals. */
export interface ResidualQuery {
  page?: number;
  pageSize?: number;
  sort?: ResidualSort;
  dir?: "asc" | "desc";
  /** "out" = outside tolerance only, "outliers" = flagged outliers only. */
  only?: "out" | "outliers";
  arm?: string;
  crop?: string;
  bed?: string;
  fix?: string;
  day?: string;
  /** Plant id contains. */
  q?: string;
}
