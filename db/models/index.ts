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
