import { sequelize } from '../db/sequelize.ts';
import { User } from './user.ts';
import { initReferenceModels, VocabularyTerm, Dyestuff, Chemical } from './reference.ts';
import { initCatalogueModels, Piece, Photo, Region, PaletteColour, ColourMeasurement } from './catalogue.ts';
import { initTrialModels, Trial, RecipeStep, Substitution, TrialSeries } from './trials.ts';
import { initBatchModels, MordantBatch, BatchEvent } from './batches.ts';
import { initAuditModel, AuditEvent } from './audit.ts';
import { Session } from './session.ts';
import { AuthToken } from './auth-token.ts';
import { initJobModel, Job } from './job.ts';
import { AppSetting } from './settings.ts';
import { RateLimit } from './rate-limit.ts';
import { FadingPair } from './fading.ts';
import { initRecordModels, Analysis, ConditionReport, DisplayPeriod } from './records.ts';
import { initSavedSearchModel, SavedSearch } from './saved-search.ts';

User.initModel(sequelize);
initReferenceModels(sequelize);
initCatalogueModels(sequelize);
initTrialModels(sequelize);
initBatchModels(sequelize);
initAuditModel(sequelize);
Session.initModel(sequelize);
AuthToken.initModel(sequelize);
initJobModel(sequelize);
AppSetting.initModel(sequelize);
RateLimit.initModel(sequelize);
FadingPair.initModel(sequelize);
initRecordModels(sequelize);
initSavedSearchModel(sequelize);

// Associations, all in one place.
Piece.belongsTo(User, { as: 'createdBy', foreignKey: 'createdById' });
Piece.hasMany(Photo, { as: 'photos', foreignKey: 'pieceId' });
Photo.belongsTo(Piece, { as: 'piece', foreignKey: 'pieceId' });
Photo.belongsTo(Trial, { as: 'trial', foreignKey: 'trialId', constraints: false });
Photo.hasMany(Region, { as: 'regions', foreignKey: 'photoId' });
Photo.hasMany(PaletteColour, { as: 'palette', foreignKey: 'photoId' });
Region.belongsTo(Photo, { as: 'photo', foreignKey: 'photoId' });
PaletteColour.belongsTo(Photo, { as: 'photo', foreignKey: 'photoId' });
PaletteColour.belongsTo(Region, { as: 'region', foreignKey: 'regionId' });
ColourMeasurement.belongsTo(Piece, { as: 'piece', foreignKey: 'pieceId' });
ColourMeasurement.belongsTo(Region, { as: 'region', foreignKey: 'regionId' });
ColourMeasurement.belongsTo(Trial, { as: 'trial', foreignKey: 'trialId' });
Trial.belongsTo(Piece, { as: 'piece', foreignKey: 'pieceId' });
Trial.belongsTo(User, { as: 'dyer', foreignKey: 'dyerId' });
Trial.belongsTo(TrialSeries, { as: 'series', foreignKey: 'seriesId' });
Trial.hasMany(RecipeStep, { as: 'steps', foreignKey: 'trialId' });
Trial.hasMany(Substitution, { as: 'substitutions', foreignKey: 'trialId' });
Trial.hasMany(Photo, { as: 'photos', foreignKey: 'trialId', constraints: false });
Trial.hasMany(ColourMeasurement, { as: 'measurements', foreignKey: 'trialId' });
Piece.hasMany(Trial, { as: 'trials', foreignKey: 'pieceId' });
RecipeStep.belongsTo(MordantBatch, { as: 'batch', foreignKey: 'batchId' });
Substitution.belongsTo(Chemical, { as: 'historicalChemical', foreignKey: 'historicalChemicalId' });
Substitution.belongsTo(Chemical, { as: 'modernChemical', foreignKey: 'modernChemicalId' });
TrialSeries.hasMany(Trial, { as: 'trials', foreignKey: 'seriesId' });
MordantBatch.hasMany(BatchEvent, { as: 'events', foreignKey: 'batchId' });
MordantBatch.belongsTo(MordantBatch, { as: 'parent', foreignKey: 'parentId' });
MordantBatch.belongsTo(User, { as: 'madeBy', foreignKey: 'madeById' });
BatchEvent.belongsTo(MordantBatch, { as: 'batch', foreignKey: 'batchId' });
AuditEvent.belongsTo(User, { as: 'actor', foreignKey: 'actorId' });
AuthToken.belongsTo(User, { as: 'user', foreignKey: 'userId' });
AuthToken.belongsTo(User, { as: 'createdBy', foreignKey: 'createdById' });
Job.belongsTo(User, { as: 'createdBy', foreignKey: 'createdById', constraints: false });
FadingPair.belongsTo(Piece, { as: 'piece', foreignKey: 'pieceId', constraints: false });
Analysis.belongsTo(Piece, { as: 'piece', foreignKey: 'pieceId' });
ConditionReport.belongsTo(Piece, { as: 'piece', foreignKey: 'pieceId' });
DisplayPeriod.belongsTo(Piece, { as: 'piece', foreignKey: 'pieceId' });
SavedSearch.belongsTo(User, { as: 'user', foreignKey: 'userId' });

export {
  sequelize,
  User,
  VocabularyTerm,
  Dyestuff,
  Chemical,
  Piece,
  Photo,
  Region,
  PaletteColour,
  ColourMeasurement,
  Trial,
  RecipeStep,
  Substitution,
  TrialSeries,
  MordantBatch,
  BatchEvent,
  AuditEvent,
  Session,
  AuthToken,
  Job,
  SavedSearch,
  AppSetting,
  RateLimit,
  FadingPair,
  Analysis,
  ConditionReport,
  DisplayPeriod,
};
