/** Shapes of the review API's answers. Times ISO 8601 UTC. */
import type { Role } from "@/lib/roles";
import type { LifecycleState, ReviewAction } from "./lifecycle";
import type { ReturnReason } from "./return-reasons";
import type { ChecklistRecord } from "./checklist";
import type { JsonDifference } from "./diff";

export interface ReviewEventDto {
  id: string;
  kind: "submitted" | "returned" | "signed_off" | "revised" | "verified";
  revision: number;
  actorName: string;
  actorRole: string;
  note: string | null;
  reasons: ReturnReason[] | null;
  detail: unknown;
  at: string;
}

export interface SignoffDto {
  revision: number;
  signerName: string;
  signerRole: string;
  typedName: string;
  checklist: ChecklistRecord;
  comment: string | null;
  /** Accepted although some verdict criterion failed. */
  deviation: boolean;
  algorithm: "sha256";
  sha256: string;
  signedAt: string;
  /** The canonical JSON that was hashed; only with `?canonical=1`. */
  canonical?: string;
}

export interface RevisionLinkDto {
  id: string;
  revision: number;
  state: LifecycleState;
  title: string;
  createdAt: string;
}

/** GET /api/audits/:id/signoff — where the audit stands in review, and what the viewer may do. */
export interface ReviewDto {
  auditId: string;
  title: string;
  state: LifecycleState;
  revision: number;
  revisionOf: string | null;
  /** The corrected revision of this (returned) audit, when there is one. */
  revisedBy: string | null;
  /** Every revision of this audit's chain, oldest first. */
  revisions: RevisionLinkDto[];
  submitted: { by: string; at: string; note: string | null } | null;
  returned: { by: string; at: string; reasons: ReturnReason[]; comment: string | null } | null;
  signoff: SignoffDto | null;
  events: ReviewEventDto[];
  viewerRole: Role;
  /** Actions the viewer may take now. "verify" is open to every member once results exist. */
  allowed: (ReviewAction | "verify")[];
}

export interface VerificationCheckDto {
  id:
    | "record"
    | "raw-files"
    | "stored-points"
    | "stored-files"
    | "stored-results"
    | "recomputed-results"
    | "stored-hash"
    | "recomputed-hash";
  ok: boolean;
  /** A difference that is explained rather than a failure (re-computed by a newer engine than the one that signed). */
  informational?: boolean;
  label: string;
  /** What was found, in plain words. */
  text: string;
  differences?: JsonDifference[];
}

/** POST /api/audits/:id/verify */
export interface VerificationDto {
  auditId: string;
  /** True only when every check passed. */
  ok: boolean;
  signed: boolean;
  /** The hash stored at sign-off, when signed. */
  signedSha256: string | null;
  /** Hash of the record rebuilt from what is stored now / from a fresh computation. */
  storedSha256: string | null;
  recomputedSha256: string | null;
  checks: VerificationCheckDto[];
  verifiedAt: string;
  verifiedBy: string;
}

export interface ActivityDto {
  id: number;
  at: string;
  action: string;
  actorName: string | null;
  subjectType: string;
  subjectId: string | null;
  /** One plain sentence. */
  text: string;
  /** Link to the subject, when there is a page for it. */
  href: string | null;
}

export interface InvitationDto {
  id: string;
  email: string;
  role: Role;
  status: "pending" | "accepted" | "canceled" | "rejected" | "expired";
  expiresAt: string;
  invitedBy: string | null;
  createdAt: string;
  /** The link the invitee opens (also in the e-mail). */
  link: string;
}
