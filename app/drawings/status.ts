// Revision statuses and processing states in the words the screens use. Isomorphic.
import type { ProcessingState, RevisionStatus } from "../../db/models/drawing-revision";

export const STATUS_LABELS: Record<RevisionStatus, string> = {
  draft: "Draft",
  for_review: "Issued for review",
  accepted: "Accepted for construction",
  superseded: "Superseded",
  withdrawn: "Withdrawn",
};

export const PROCESSING_LABELS: Record<ProcessingState, string> = {
  queued: "Waiting to be processed",
  running: "Processing",
  done: "Ready",
  failed: "Processing failed",
};

/** The statuses a revision may be issued with, and which it may be issued from. */
export const ISSUE_STATUSES = ["for_review", "accepted"] as const;
export type IssueStatus = (typeof ISSUE_STATUSES)[number];
export const ISSUABLE_FROM: readonly RevisionStatus[] = ["draft", "for_review", "accepted"];

export const DISCIPLINES = ["Architectural", "Plumbing", "Structural", "Electrical", "Mechanical", "Civil", "Site sketch", "Other"] as const;

export type { ProcessingState, RevisionStatus };
