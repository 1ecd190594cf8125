/**
 * The review lifecycle of an audit, as a table: which role may move an audit from which state to which (the
 * role lists are the named permissions of lib/roles.ts: preparers submit and revise, reviewers sign off and return).
 * Pure and free of server imports, so client components can ask it which buttons to show; the route
 * handlers ask the same table before changing anything.
 *
 *   computing → computed | failed                       (the engine; at start-up an interrupted computation
 *                                                        starts again, and fails after two more interruptions)
 *   failed    → computing (the same row)                recompute  owner, QA lead, technician
 *   computed  → submitted                               submit     owner, QA lead, technician
 *   submitted → signed_off                              sign off   owner, QA lead
 *   submitted → returned                                return     owner, QA lead
 *   returned  → computing (a new revision row)          revise     owner, QA lead, technician
 *   signed_off → nothing, ever.
 */
import { CAN_PREPARE, CAN_REVIEW, type Role } from "@/lib/roles";

export const AUDIT_STATES = ["computing", "computed", "failed", "submitted", "signed_off", "returned"] as const;
export type LifecycleState = (typeof AUDIT_STATES)[number];

export const REVIEW_ACTIONS = ["submit", "sign_off", "return", "revise", "recompute"] as const;
export type ReviewAction = (typeof REVIEW_ACTIONS)[number];

export interface Transition {
  action: ReviewAction;
  from: LifecycleState;
  /** For "revise" the old audit stays "returned"; `to` is the state of the new revision. */
  to: LifecycleState;
  roles: readonly Role[];
}

export const TRANSITIONS: readonly Transition[] = [
  { action: "submit", from: "computed", to: "submitted", roles: CAN_PREPARE },
  { action: "sign_off", from: "submitted", to: "signed_off", roles: CAN_REVIEW },
  { action: "return", from: "submitted", to: "returned", roles: CAN_REVIEW },
  { action: "revise", from: "returned", to: "computing", roles: CAN_PREPARE },
  // The same files, profile copy and settings again (a failure such as the server stopping may not recur).
  { action: "recompute", from: "failed", to: "computing", roles: CAN_PREPARE },
];

/** Plain names of the states, our own wording. */
export const STATE_NAME: Record<LifecycleState, string> = {
  computing: "Computing",
  computed: "Computed, not yet submitted",
  failed: "Failed to compute",
  submitted: "Waiting for sign-off",
  signed_off: "Signed off",
  returned: "Returned for correction",
};

export const ACTION_NAME: Record<ReviewAction, string> = {
  submit: "Submit for sign-off",
  sign_off: "Sign off",
  return: "Return for correction",
  revise: "Start a corrected revision",
  recompute: "Compute again",
};

/** The plain name of a state read as text (e.g. from a list query); never the stored code. */
export function stateName(state: string): string {
  return isLifecycleState(state) ? STATE_NAME[state] : "Unknown state";
}

export function isLifecycleState(s: unknown): s is LifecycleState {
  return typeof s === "string" && (AUDIT_STATES as readonly string[]).includes(s);
}

/** May `role` move an audit from `from` to `to`? */
export function canTransition(role: Role, from: LifecycleState, to: LifecycleState): boolean {
  return TRANSITIONS.some((t) => t.from === from && t.to === to && t.roles.includes(role));
}

export function transitionOf(action: ReviewAction): Transition {
  return TRANSITIONS.find((t) => t.action === action)!;
}

/** The actions `role` can take on an audit in `state` right now. */
export function allowedActions(role: Role, state: LifecycleState): ReviewAction[] {
  return TRANSITIONS.filter((t) => t.from === state && t.roles.includes(role)).map((t) => t.action);
}

/**
 * Why `action` is refused, or null when it is allowed. The role is checked first (403), then the
 * state (409) — a role that may never take the action learns nothing about the audit's state.
 * `hasRevision`: a returned audit that already has a corrected revision cannot be revised twice.
 */
export function refusal(
  role: Role,
  state: LifecycleState,
  action: ReviewAction,
  opts: { hasRevision?: boolean } = {},
): { status: 403 | 409; message: string } | null {
  const t = transitionOf(action);
  if (!t.roles.includes(role)) {
    return { status: 403, message: `${ACTION_NAME[action]} needs the ${t.roles.map(roleWord).join(" or ")} role.` };
  }
  if (state === "signed_off") {
    return {
      status: 409,
      message:
        "This audit is signed off. A signed-off audit, its files and its results can no longer be changed; run a new audit if the field needs checking again.",
    };
  }
  if (state !== t.from) {
    return {
      status: 409,
      message: `${ACTION_NAME[action]} is only possible ${t.from === "failed" ? "for an audit that failed to compute" : `when the audit is ${STATE_NAME[t.from].toLowerCase()}`}; it is ${STATE_NAME[state].toLowerCase()}.`,
    };
  }
  if (action === "revise" && opts.hasRevision) {
    return { status: 409, message: "This returned audit already has a corrected revision; continue with that one." };
  }
  return null;
}

function roleWord(r: Role): string {
  return { owner: "owner", qa_lead: "QA lead", technician: "technician", grower: "grower" }[r];
}
