import type { Sequelize } from 'sequelize';
import { AuditEvent } from './AuditEvent.ts';
import { AuthToken } from './AuthToken.ts';
import { ConditionCheck } from './ConditionCheck.ts';
import { DamageTerm } from './DamageTerm.ts';
import { GradeInterval } from './GradeInterval.ts';
import { LoginThrottle } from './LoginThrottle.ts';
import { MailPreference } from './MailPreference.ts';
import { OutgoingMail } from './OutgoingMail.ts';
import { Photo } from './Photo.ts';
import { PhotoComparison } from './PhotoComparison.ts';
import { PhotoDerivative } from './PhotoDerivative.ts';
import { PhotoUpload } from './PhotoUpload.ts';
import { PhotoMarkLayer } from './PhotoMarkLayer.ts';
import { SignInDevice } from './SignInDevice.ts';
import { Specimen } from './Specimen.ts';
import { StorageLocation } from './StorageLocation.ts';
import { Treatment } from './Treatment.ts';
import { TreatmentMaterial } from './TreatmentMaterial.ts';
import { User } from './User.ts';
import { UserSession } from './UserSession.ts';

export type { TokenPurpose } from './AuthToken.ts';
export { AuditEvent, AuthToken, ConditionCheck, DamageTerm, GradeInterval, LoginThrottle, MailPreference, OutgoingMail, Photo, PhotoComparison, PhotoDerivative, PhotoMarkLayer, PhotoUpload, SignInDevice, Specimen, StorageLocation, Treatment, TreatmentMaterial, User, UserSession };
export type { DerivativeKind } from './PhotoDerivative.ts';

/** Binds every model to one connection and declares the associations. */
export function initModels(sequelize: Sequelize): void {
	for (const m of [AuditEvent, AuthToken, ConditionCheck, DamageTerm, GradeInterval, LoginThrottle, MailPreference, OutgoingMail, Photo, PhotoComparison, PhotoDerivative, PhotoMarkLayer, PhotoUpload, SignInDevice, Specimen, StorageLocation, Treatment, TreatmentMaterial, User, UserSession]) {
		m.initModel(sequelize);
	}
	Specimen.belongsTo(StorageLocation, { foreignKey: 'storageLocationId', as: 'location' });
	StorageLocation.hasMany(Specimen, { foreignKey: 'storageLocationId' });
	AuthToken.belongsTo(User, { foreignKey: 'userId' });
	UserSession.belongsTo(User, { foreignKey: 'userId' });
	ConditionCheck.belongsTo(Specimen, { foreignKey: 'specimenId', as: 'specimen' });
	Specimen.hasMany(ConditionCheck, { foreignKey: 'specimenId', as: 'checks' });
	ConditionCheck.belongsTo(User, { foreignKey: 'examinerId', as: 'examiner' });
	ConditionCheck.belongsTo(User, { foreignKey: 'reviewerId', as: 'reviewer' });
	Photo.belongsTo(User, { foreignKey: 'uploadedBy', as: 'uploader' });
	Photo.belongsTo(Specimen, { foreignKey: 'specimenId', as: 'specimen' });
	Photo.belongsTo(ConditionCheck, { foreignKey: 'checkId', as: 'check' });
	Photo.hasMany(PhotoDerivative, { foreignKey: 'photoId', as: 'derivatives' });
	Treatment.belongsTo(Specimen, { foreignKey: 'specimenId', as: 'specimen' });
	Treatment.belongsTo(User, { foreignKey: 'createdBy', as: 'author' });
	Treatment.belongsTo(User, { foreignKey: 'riskReviewerId', as: 'riskReviewer' });
	Treatment.belongsTo(ConditionCheck, { foreignKey: 'beforeCheckId', as: 'beforeCheck' });
	Treatment.belongsTo(ConditionCheck, { foreignKey: 'afterCheckId', as: 'afterCheck' });
	PhotoComparison.belongsTo(User, { foreignKey: 'createdBy', as: 'creator' });
	PhotoComparison.belongsTo(User, { foreignKey: 'updatedBy', as: 'updater' });
	PhotoComparison.belongsTo(Photo, { foreignKey: 'beforePhotoId', as: 'before' });
	PhotoComparison.belongsTo(Photo, { foreignKey: 'afterPhotoId', as: 'after' });
}
