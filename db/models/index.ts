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

// Engineer verification and signing identities.
import { RegistrationVerification } from "./registration-verification";
import { SigningKey } from "./signing-key";

SigningKey.belongsTo(User, { as: "user", foreignKey: "userId" });
RegistrationVerification.belongsTo(User, { as: "verifiedBy", foreignKey: "verifiedById" });

export { RegistrationVerification, SigningKey };
