import { z } from "zod";

export const AuditIdParam = z.object({ auditId: z.uuid() });
