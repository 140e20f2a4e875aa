import type { Sequelize } from 'sequelize';
import { AnalysisJob, initAnalysisJob } from './AnalysisJob';
import { AuditEvent, initAuditEvent } from './AuditEvent';
import { ConverterCheck, initConverterCheck } from './ConverterCheck';
import { ConverterThresholdSet, initConverterThresholdSet } from './ConverterThresholdSet';
import { DeliverySpec, initDeliverySpec } from './DeliverySpec';
import { Invitation, initInvitation } from './Invitation';
import { MailDelivery, initMailDelivery } from './MailDelivery';
import { Recorder, initRecorder } from './Recorder';
import { RecordingSession, initRecordingSession } from './RecordingSession';
import { SignInFailure, initSignInFailure } from './SignInFailure';
import { Studio, initStudio } from './Studio';
import { Take, initTake } from './Take';
import { TakeComment, initTakeComment } from './TakeComment';
import { User, initUser } from './User';

export { AnalysisJob, AuditEvent, ConverterCheck, ConverterThresholdSet, DeliverySpec, Invitation, MailDelivery, Recorder, RecordingSession, SignInFailure, Studio, Take, TakeComment, User };

/** Defines every model on `sequelize` and wires the associations, once. */
export function initModels(sequelize: Sequelize) {
  for (const init of [initStudio, initUser, initRecorder, initDeliverySpec, initRecordingSession, initTake, initAuditEvent, initAnalysisJob, initMailDelivery, initInvitation, initTakeComment, initConverterCheck, initConverterThresholdSet, initSignInFailure]) {
    init(sequelize);
  }
  Studio.hasMany(User, { foreignKey: 'studioId' });
  User.belongsTo(Studio, { foreignKey: 'studioId', as: 'studio' });
  Recorder.belongsTo(Studio, { foreignKey: 'studioId' });
  DeliverySpec.belongsTo(Studio, { foreignKey: 'studioId' });
  RecordingSession.belongsTo(Studio, { foreignKey: 'studioId' });
  RecordingSession.belongsTo(User, { foreignKey: 'engineerId', as: 'engineer' });
  RecordingSession.belongsTo(User, { foreignKey: 'producerId', as: 'producer' });
  RecordingSession.belongsTo(DeliverySpec, { foreignKey: 'deliverySpecId', as: 'deliverySpec' });
  RecordingSession.hasMany(Take, { foreignKey: 'sessionId', as: 'takes' });
  Take.belongsTo(RecordingSession, { foreignKey: 'sessionId', as: 'session' });
  Take.belongsTo(Recorder, { foreignKey: 'recorderId', as: 'recorder' });
  Take.belongsTo(User, { foreignKey: 'uploadedById', as: 'uploadedBy' });
  Take.belongsTo(User, { foreignKey: 'decidedById', as: 'decidedBy' });
  Take.hasOne(AnalysisJob, { foreignKey: 'takeId', as: 'job' });
  AnalysisJob.belongsTo(Take, { foreignKey: 'takeId', as: 'take' });
  AuditEvent.belongsTo(User, { foreignKey: 'actorId', as: 'actor' });
  Take.hasMany(TakeComment, { foreignKey: 'takeId', as: 'comments' });
  TakeComment.belongsTo(User, { foreignKey: 'authorId', as: 'author' });
  MailDelivery.belongsTo(User, { foreignKey: 'sentById', as: 'sentBy' });
  Invitation.belongsTo(User, { foreignKey: 'userId', as: 'user' });
  ConverterCheck.belongsTo(Recorder, { foreignKey: 'recorderId', as: 'recorder' });
  ConverterCheck.belongsTo(User, { foreignKey: 'uploadedById', as: 'uploadedBy' });
  ConverterCheck.belongsTo(User, { foreignKey: 'baselineSetById', as: 'baselineSetBy' });
  ConverterCheck.hasOne(AnalysisJob, { foreignKey: 'converterCheckId', as: 'job' });
}
