/** URLs of the map's endpoints (also its SWR keys). */
export const mapKeys = {
  /** Binary payload of an audit (lib/map/binary.ts). */
  auditMapData: (auditId: string) => `/api/audits/${auditId}/map-data`,
  /** One pair's full record. */
  mapPair: (auditId: string, seq: number) => `/api/audits/${auditId}/map-data?pair=${seq}`,
  /** One unpaired point's full record. */
  mapUnpaired: (auditId: string, seq: number) => `/api/audits/${auditId}/map-data?unpaired=${seq}`,
  /** The grower's summary of a field (FieldMapDto). */
  fieldMap: (fieldId: string) => `/api/fields/${fieldId}/map`,
};
