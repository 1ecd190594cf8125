export type { Episode } from "@/lib/audit/diagnostics";
export type { MeanInterval as MeanIntervalLike } from "@/lib/audit/diagnostics/mean-interval";
