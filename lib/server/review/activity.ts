import "server-only";
import type { ActivityRow } from "@/db/queries/activity";
import { activityHref, activityText } from "@/lib/review/activity-text";
import type { ActivityDto } from "@/lib/review/types";

export function toActivityDtos(rows: ActivityRow[]): ActivityDto[] {
  return rows.map((r) => ({
    id: r.id,
    at: r.at.toISOString(),
    action: r.action,
    actorName: r.actorName,
    subjectType: r.subjectType,
    subjectId: r.subjectId,
    text: activityText(r.action, r.actorName, r.detail),
    href: activityHref(r.subjectType, r.subjectId),
  }));
}
