import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { ComparisonSummary, ControlPair, Matrix3, RegistrationModel } from '../../compare/index.ts';

/** A saved comparison of two photographs of one specimen (see src/lib/compare/schema.ts). */
export class PhotoComparison extends Model<InferAttributes<PhotoComparison>, InferCreationAttributes<PhotoComparison>> {
	declare id: CreationOptional<string>;
	declare specimenId: string;
	declare beforePhotoId: string;
	declare afterPhotoId: string;
	declare model: RegistrationModel;
	declare controlPoints: ControlPair[];
	/** After-photo px → before-photo px; null when compared unaligned. */
	declare transform: Matrix3 | null;
	declare summary: ComparisonSummary;
	declare note: CreationOptional<string>;
	declare version: CreationOptional<number>;
	declare createdBy: string;
	declare updatedBy: string;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		PhotoComparison.init(
			{
				id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
				specimenId: { type: DataTypes.UUID, allowNull: false },
				beforePhotoId: { type: DataTypes.UUID, allowNull: false },
				afterPhotoId: { type: DataTypes.UUID, allowNull: false },
				model: { type: DataTypes.STRING(12), allowNull: false },
				controlPoints: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
				transform: { type: DataTypes.JSONB, allowNull: true },
				summary: { type: DataTypes.JSONB, allowNull: false },
				note: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
				// Starts at 1 (as the column does); Sequelize's lock adds 1 on every instance save.
				version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
				createdBy: { type: DataTypes.UUID, allowNull: false },
				updatedBy: { type: DataTypes.UUID, allowNull: false },
				createdAt: DataTypes.DATE,
				updatedAt: DataTypes.DATE,
			},
			{ sequelize, tableName: 'photo_comparisons', version: true },
		);
	}
}
