/**
 * The Sequelize models, one a file (definitions only; the logic is in services/), and the
 * associations between them. Import models from here, so that the associations are set up.
 */
import { ApiToken } from './api-token';
import { Batch } from './batch';
import { CaseResultRow } from './case-result';
import { PasswordReset } from './password-reset';
import { Project } from './project';
import { ReportRow } from './report';
import { ResultRow } from './result';
import { Review } from './review';
import { SectionRow } from './section';
import { StoredFile } from './stored-file';
import { StudyRow } from './study';
import { User } from './user';

User.hasMany(ApiToken, { foreignKey: 'userId' });
ApiToken.belongsTo(User, { foreignKey: 'userId' });
Project.belongsTo(User, { foreignKey: 'createdBy', as: 'creator' });
Project.hasMany(Batch, { foreignKey: 'projectId' });
Batch.belongsTo(Project, { foreignKey: 'projectId' });
Batch.belongsTo(User, { foreignKey: 'submittedBy', as: 'submitter' });
Batch.hasMany(SectionRow, { foreignKey: 'batchId' });
SectionRow.belongsTo(Batch, { foreignKey: 'batchId' });
SectionRow.hasMany(ResultRow, { foreignKey: 'sectionId' });
ResultRow.belongsTo(SectionRow, { foreignKey: 'sectionId' });
ResultRow.hasMany(CaseResultRow, { foreignKey: 'resultId', as: 'cases' });
CaseResultRow.belongsTo(ResultRow, { foreignKey: 'resultId' });
Review.belongsTo(User, { foreignKey: 'reviewerId', as: 'reviewer' });
Review.belongsTo(Batch, { foreignKey: 'batchId' });
Review.belongsTo(SectionRow, { foreignKey: 'sectionId' });
Batch.hasMany(Review, { foreignKey: 'batchId' });
PasswordReset.belongsTo(User, { foreignKey: 'userId' });
StoredFile.belongsTo(User, { foreignKey: 'createdBy', as: 'creator' });
Batch.hasMany(StoredFile, { foreignKey: 'batchId' });
ReportRow.belongsTo(Batch, { foreignKey: 'batchId' });
ReportRow.belongsTo(SectionRow, { foreignKey: 'sectionId' });
ReportRow.belongsTo(User, { foreignKey: 'requestedBy', as: 'requester' });
ReportRow.belongsTo(StoredFile, { foreignKey: 'fileId', as: 'file' });
StudyRow.belongsTo(SectionRow, { foreignKey: 'sectionId' });
StudyRow.belongsTo(Batch, { foreignKey: 'batchId' });
StudyRow.belongsTo(User, { foreignKey: 'requestedBy', as: 'requester' });

export { ApiToken } from './api-token';
export { AuditEntry } from './audit-entry';
export { Batch, type BatchStatus } from './batch';
export { CaseResultRow } from './case-result';
export { PasswordReset } from './password-reset';
export { Project } from './project';
export {
  APPENDIX_CHOICES,
  REPORT_KINDS,
  REPORT_STATES,
  ReportRow,
  type Appendix,
  type ReportKind,
  type ReportState,
} from './report';
export { ResultRow } from './result';
export { Review } from './review';
export { SectionRow, type SectionStatus } from './section';
export { STORED_FILE_KINDS, StoredFile, type StoredFileKind } from './stored-file';
export { STUDY_KINDS, STUDY_STATES, StudyRow, type StudyKind, type StudyState } from './study';
export { ROLES, User, type Role } from './user';
export { WorkerHeartbeat } from './worker-heartbeat';
