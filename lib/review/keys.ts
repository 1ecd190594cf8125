/** SWR keys (API URLs) of the review screens. */
export const reviewKeys = {
  review: (auditId: string) => `/api/audits/${auditId}/signoff`,
  activity: (auditId: string) => `/api/audits/${auditId}/activity`,
  /** The audit itself (same key as lib/swr-keys.ts `keys.audit`), refreshed after every review step. */
  audit: (auditId: string) => `/api/audits/${auditId}`,
};
