// The life cycle of a write-up revision, and who may move it from which state to which.
//
//   Draft ──submit──▶ Awaiting review ──publish──▶ Published ──withdraw──▶ Withdrawn
//     ▲                 │        │
//     └──(edit)── Needs changes ◀┘ ask for changes
//                       │
//                  decline ──▶ Declined
//
// Editing a published write-up starts a new revision (a Draft); the published revision stays
// visible until a moderator publishes the new one.

export const REVISION_STATES = ["draft", "awaiting_review", "needs_changes", "published", "declined", "withdrawn"] as const;
export type RevisionState = (typeof REVISION_STATES)[number];

export const STATE_LABELS: Record<RevisionState, string> = {
  draft: "Draft",
  awaiting_review: "Awaiting review",
  needs_changes: "Needs changes",
  published: "Published",
  declined: "Declined",
  withdrawn: "Withdrawn",
};

export type Action = "edit" | "submit" | "publish" | "request_changes" | "decline" | "withdraw" | "superseded";

type Actor = { isAuthor: boolean; isModerator: boolean };

type Rule = { from: readonly RevisionState[]; to: RevisionState; who: (a: Actor) => boolean };

const RULES: Record<Exclude<Action, "edit" | "superseded">, Rule> = {
  submit: { from: ["draft", "needs_changes"], to: "awaiting_review", who: (a) => a.isAuthor },
  publish: { from: ["awaiting_review"], to: "published", who: (a) => a.isModerator && !a.isAuthor },
  request_changes: { from: ["awaiting_review"], to: "needs_changes", who: (a) => a.isModerator && !a.isAuthor },
  decline: { from: ["awaiting_review"], to: "declined", who: (a) => a.isModerator && !a.isAuthor },
  withdraw: { from: ["published", "awaiting_review", "draft", "needs_changes"], to: "withdrawn", who: (a) => a.isAuthor || a.isModerator },
};

export type Transition = { ok: true; to: RevisionState } | { ok: false; reason: string };

/** May this actor take this action on a revision in this state? Moderators never review their own work. */
export function transition(state: RevisionState, action: keyof typeof RULES, actor: Actor): Transition {
  const rule = RULES[action];
  if (!rule.who(actor)) {
    if ((action === "publish" || action === "request_changes" || action === "decline") && actor.isAuthor) {
      return { ok: false, reason: "Another moderator must review your own write-up." };
    }
    return { ok: false, reason: "Your account may not do that to this write-up." };
  }
  if (!rule.from.includes(state)) {
    return { ok: false, reason: `A write-up that is “${STATE_LABELS[state]}” cannot be ${ACTION_PAST[action]}.` };
  }
  return { ok: true, to: rule.to };
}

const ACTION_PAST: Record<keyof typeof RULES, string> = {
  submit: "sent for review",
  publish: "published",
  request_changes: "sent back for changes",
  decline: "declined",
  withdraw: "withdrawn",
};

/** The author may change the text of a revision only while it is theirs to work on. */
export function canEdit(state: RevisionState): boolean {
  return state === "draft" || state === "needs_changes";
}

export const DECISIONS = ["publish", "request_changes", "decline"] as const;
export type Decision = (typeof DECISIONS)[number];
export const DECISION_LABELS: Record<Decision, string> = {
  publish: "Publish",
  request_changes: "Ask for changes",
  decline: "Decline",
};

// The moderator's checklist before publishing.
export type ChecklistKey = "cautions" | "measurements" | "photos" | "tone";
export const CHECKLIST: { key: ChecklistKey; label: string }[] = [
  { key: "cautions", label: "The usual cautions are there where the work needs them (batteries, wiring, resins, dust, weight)." },
  { key: "measurements", label: "The measurements are plausible for the class and say how they were taken." },
  { key: "photos", label: "The photos show no personal data (faces, names, registration numbers, addresses)." },
  { key: "tone", label: "The tone is fair to other members and to suppliers." },
];

