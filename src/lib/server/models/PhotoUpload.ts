import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { PhotoStage, PhotoView, UploadState } from '../../photos/vocabulary.ts';

/** One tus upload, from its creation to a recorded photo or a refusal with its reason. */
export class PhotoUpload extends Model<InferAttributes<PhotoUpload>, InferCreationAttributes<PhotoUpload>> {
	declare id: string;
	declare specimenId: string;
	declare checkId: string | null;
	declare view: PhotoView;
	declare stage: PhotoStage;
	declare fileName: string;
	declare declaredType: string | null;
	declare declaredSize: number;
	declare clientSha256: string | null;
	declare uploaderId: string;
	declare state: CreationOptional<UploadState>;
	declare refusalCode: string | null;
	declare reason: string | null;
	declare photoId: string | null;
	declare finishedAt: Date | null;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		PhotoUpload.init(
			{
				id: { type: DataTypes.STRING(64), primaryKey: true },
				specimenId: { type: DataTypes.UUID, allowNull: false },
				checkId: { type: DataTypes.UUID, allowNull: true },
				view: { type: DataTypes.STRING(12), allowNull: false },
				stage: { type: DataTypes.STRING(20), allowNull: false },
				fileName: { type: DataTypes.STRING(255), allowNull: false },
				declaredType: { type: DataTypes.STRING(100), allowNull: true },
				declaredSize: { type: DataTypes.BIGINT, allowNull: false, get() { return Number(this.getDataValue('declaredSize')); } },
				clientSha256: { type: DataTypes.CHAR(64), allowNull: true },
				uploaderId: { type: DataTypes.UUID, allowNull: false },
				state: { type: DataTypes.STRING(12), allowNull: false, defaultValue: 'receiving' },
				refusalCode: { type: DataTypes.STRING(20), allowNull: true },
				reason: { type: DataTypes.TEXT, allowNull: true },
				photoId: { type: DataTypes.UUID, allowNull: true },
				finishedAt: { type: DataTypes.DATE, allowNull: true },
				createdAt: DataTypes.DATE,
				updatedAt: DataTypes.DATE,
			},
			{ sequelize, tableName: 'photo_uploads' },
		);
	}
}
