// Every model, registered on the one connection, with the associations the services use.
import { AuditEvent } from "./audit-event";
import { Invitation } from "./invitation";
import { PasswordReset } from "./password-reset";
import { Project } from "./project";
import { ProjectMember } from "./project-member";
import { Session } from "./session";
import { SignInAttempt } from "./sign-in-attempt";
import { User } from "./user";

ProjectMember.belongsTo(User, { as: "user", foreignKey: "userId" });
ProjectMember.belongsTo(Project, { as: "project", foreignKey: "projectId" });
Project.hasMany(ProjectMember, { as: "members", foreignKey: "projectId" });
User.hasMany(ProjectMember, { as: "memberships", foreignKey: "userId" });
Invitation.belongsTo(Project, { as: "project", foreignKey: "projectId" });
Invitation.belongsTo(User, { as: "invitedBy", foreignKey: "invitedById" });

export { AuditEvent, Invitation, PasswordReset, Project, ProjectMember, Session, SignInAttempt, User };
export { REGISTRATION_STATES, type RegistrationState } from "./user";
export { sequelize, isDatabaseUnavailable } from "../connection";

// The drawing register.
import { Drawing } from "./drawing";
import { DrawingRevision } from "./drawing-revision";
import { Transmittal } from "./transmittal";
import { TransmittalItem } from "./transmittal-item";
import { TransmittalRecipient } from "./transmittal-recipient";

Drawing.hasMany(DrawingRevision, { as: "revisions", foreignKey: "drawingId" });
DrawingRevision.belongsTo(Drawing, { as: "drawing", foreignKey: "drawingId" });
DrawingRevision.belongsTo(User, { as: "uploadedBy", foreignKey: "uploadedById" });
DrawingRevision.belongsTo(User, { as: "issuedBy", foreignKey: "issuedById" });
Transmittal.hasMany(TransmittalItem, { as: "items", foreignKey: "transmittalId" });
Transmittal.hasMany(TransmittalRecipient, { as: "recipients", foreignKey: "transmittalId" });
Transmittal.belongsTo(User, { as: "issuedBy", foreignKey: "issuedById" });
TransmittalItem.belongsTo(DrawingRevision, { as: "revision", foreignKey: "revisionId" });
TransmittalRecipient.belongsTo(User, { as: "user", foreignKey: "userId" });
TransmittalRecipient.belongsTo(Transmittal, { as: "transmittal", foreignKey: "transmittalId" });

export { Drawing, DrawingRevision, Transmittal, TransmittalItem, TransmittalRecipient };
export { PROCESSING_STATES, REVISION_STATUSES, type PageSize, type ProcessingState, type RevisionStatus, type TextRun } from "./drawing-revision";

// Deviation requests and their review.
import { AssessmentRow } from "./assessment";
import { Attachment } from "./attachment";
import { Comment } from "./comment";
import { Decision } from "./decision";
import { DeviationRequest } from "./deviation-request";
import { ProjectMute } from "./project-mute";
import { RequestPin } from "./request-pin";
import { RequestVersion } from "./request-version";

DeviationRequest.belongsTo(Project, { as: "project", foreignKey: "projectId" });
DeviationRequest.belongsTo(User, { as: "assignee", foreignKey: "assigneeId" });
DeviationRequest.belongsTo(User, { as: "createdBy", foreignKey: "createdById" });
DeviationRequest.hasMany(RequestVersion, { as: "versions", foreignKey: "requestId" });
RequestVersion.belongsTo(User, { as: "createdBy", foreignKey: "createdById" });
Attachment.belongsTo(User, { as: "uploadedBy", foreignKey: "uploadedById" });
Comment.belongsTo(User, { as: "author", foreignKey: "authorId" });
Comment.hasMany(Attachment, { as: "attachments", foreignKey: "commentId" });
Decision.hasMany(AssessmentRow, { as: "assessments", foreignKey: "decisionId" });
Decision.belongsTo(User, { as: "decidedBy", foreignKey: "decidedById" });

export { AssessmentRow, Attachment, Comment, Decision, DeviationRequest, ProjectMute, RequestPin, RequestVersion };
export type { Measurement } from "./request-version";
export type { Condition } from "./decision";
export type { EvidenceLink } from "./assessment";

// Engineer verification and signing identities.
import { RegistrationVerification } from "./registration-verification";
import { SigningKey } from "./signing-key";

SigningKey.belongsTo(User, { as: "user", foreignKey: "userId" });
RegistrationVerification.belongsTo(User, { as: "verifiedBy", foreignKey: "verifiedById" });

export { RegistrationVerification, SigningKey };

// Saved calculations.
import { Calculation } from "./calculation";

Calculation.belongsTo(User, { as: "creator", foreignKey: "createdBy" });

export { Calculation };

// Signed approvals and installation records.
import { Approval } from "./approval";
import { InstallationRecord } from "./installation-record";

Approval.belongsTo(User, { as: "signer", foreignKey: "signerId" });
Approval.belongsTo(DeviationRequest, { as: "request", foreignKey: "requestId" });
Approval.hasMany(InstallationRecord, { as: "installations", foreignKey: "approvalId" });
InstallationRecord.belongsTo(User, { as: "recordedBy", foreignKey: "recordedById" });

export { Approval, InstallationRecord };
export { APPROVAL_STATES, type ApprovalState } from "./approval";

// The engineer's markups on sheets.
import { Markup } from "./markup";

Markup.belongsTo(User, { as: "author", foreignKey: "authorId" });

export { Markup };

// Non-compliance notices to owners.
import { NoncomplianceNotice } from "./noncompliance-notice";

NoncomplianceNotice.belongsTo(User, { as: "createdBy", foreignKey: "createdById" });

export { NoncomplianceNotice };
export type { NoticeItem } from "./noncompliance-notice";
