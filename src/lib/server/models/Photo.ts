import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { PhotoStage, PhotoView } from '../../photos/vocabulary.ts';
import type { StoredExif } from '../../photos/exif.ts';

/** A recorded photograph: the master original on disk, its hash and what its EXIF says. */
export class Photo extends Model<InferAttributes<Photo>, InferCreationAttributes<Photo>> {
	declare id: CreationOptional<string>;
	declare uploadId: string;
	declare specimenId: string;
	declare checkId: string | null;
	declare view: PhotoView;
	declare stage: PhotoStage;
	declare fileName: string;
	declare mediaType: string;
	declare byteSize: number;
	declare sha256: string;
	declare masterPath: string;
	declare width: number;
	declare height: number;
	declare orientation: number | null;
	declare capturedRaw: string | null;
	declare capturedOffset: string | null;
	declare capturedAt: Date | null;
	declare camera: string | null;
	declare lens: string | null;
	declare exif: StoredExif;
	declare derivativeSet: string;
	declare uploadedBy: string;
	declare uploadedAt: Date;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		Photo.init(
			{
				id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
				uploadId: { type: DataTypes.STRING(64), allowNull: false, unique: true },
				specimenId: { type: DataTypes.UUID, allowNull: false },
				checkId: { type: DataTypes.UUID, allowNull: true },
				view: { type: DataTypes.STRING(12), allowNull: false },
				stage: { type: DataTypes.STRING(20), allowNull: false },
				fileName: { type: DataTypes.STRING(255), allowNull: false },
				mediaType: { type: DataTypes.STRING(40), allowNull: false },
				// BIGINT comes back from pg as a string; sizes stay well inside 2^53.
				byteSize: { type: DataTypes.BIGINT, allowNull: false, get() { return Number(this.getDataValue('byteSize')); } },
				sha256: { type: DataTypes.CHAR(64), allowNull: false },
				masterPath: { type: DataTypes.STRING(300), allowNull: false },
				width: { type: DataTypes.INTEGER, allowNull: false },
				height: { type: DataTypes.INTEGER, allowNull: false },
				orientation: { type: DataTypes.SMALLINT, allowNull: true },
				capturedRaw: { type: DataTypes.STRING(40), allowNull: true },
				capturedOffset: { type: DataTypes.STRING(10), allowNull: true },
				capturedAt: { type: DataTypes.DATE, allowNull: true },
				camera: { type: DataTypes.STRING(200), allowNull: true },
				lens: { type: DataTypes.STRING(200), allowNull: true },
				exif: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
				derivativeSet: { type: DataTypes.STRING(40), allowNull: false },
				uploadedBy: { type: DataTypes.UUID, allowNull: false },
				uploadedAt: { type: DataTypes.DATE, allowNull: false },
				createdAt: DataTypes.DATE,
				updatedAt: DataTypes.DATE,
			},
			{ sequelize, tableName: 'photos' },
		);
	}
}
