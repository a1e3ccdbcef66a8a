import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type {
	ClosureType,
	ContainerMaterial,
	ContainerShape,
	HazardFlag,
	PreservativeKind,
	SealType,
} from '../../specimen/vocabulary.ts';
import type { Grade, Priority } from '../../check/vocabulary.ts';

/**
 * One jar and what is in it (DESIGN.md §3). Dimensions are stored as DECIMAL, which pg returns as
 * strings; the getters turn them back into numbers. Rows are soft-deleted (paranoid) so a record
 * is never lost by one click; `version` guards against lost updates.
 */
export class Specimen extends Model<InferAttributes<Specimen>, InferCreationAttributes<Specimen>> {
	declare id: CreationOptional<string>;
	declare objectNumber: string;
	declare title: string;
	declare description: CreationOptional<string>;
	declare department: CreationOptional<string>;
	declare storageLocationId: string | null;
	declare preservativeRecorded: CreationOptional<string>;
	declare preservativeKind: PreservativeKind;
	declare containerShape: ContainerShape;
	declare innerWidthMm: number;
	declare innerDepthMm: number | null;
	declare innerHeightMm: number;
	/** The top of the specimen above the inner base, mm, as measured on the jar; null: not measured. */
	declare specimenTopMm: CreationOptional<number | null>;
	declare containerMaterial: ContainerMaterial;
	declare closureType: ClosureType;
	declare sealType: SealType;
	declare hazards: CreationOptional<{ flag: HazardFlag; note: string }[]>;
	declare nextCheckDue: string | null;
	/** The condition found by the latest approved check (kept here so the register can filter on it). */
	declare currentGrade: CreationOptional<Grade | null>;
	declare currentPriority: CreationOptional<Priority | null>;
	declare lastCheckedOn: CreationOptional<string | null>;
	declare version: CreationOptional<number>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;
	declare deletedAt: Date | null;

	static initModel(sequelize: Sequelize) {
		const mm = (field: string, allowNull: boolean) => ({
			type: DataTypes.DECIMAL(7, 1),
			allowNull,
			get(this: Specimen) {
				const raw = this.getDataValue(field as 'innerWidthMm') as unknown;
				return raw === null || raw === undefined ? null : Number(raw);
			},
		});
		Specimen.init(
			{
				id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
				objectNumber: { type: DataTypes.STRING(40), allowNull: false, unique: true },
				title: { type: DataTypes.STRING(200), allowNull: false },
				description: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
				department: { type: DataTypes.STRING(120), allowNull: false, defaultValue: '' },
				storageLocationId: { type: DataTypes.UUID, allowNull: true },
				preservativeRecorded: { type: DataTypes.STRING(200), allowNull: false, defaultValue: '' },
				preservativeKind: { type: DataTypes.STRING(20), allowNull: false },
				containerShape: { type: DataTypes.STRING(12), allowNull: false },
				innerWidthMm: mm('innerWidthMm', false),
				innerDepthMm: mm('innerDepthMm', true),
				innerHeightMm: mm('innerHeightMm', false),
				specimenTopMm: mm('specimenTopMm', true),
				containerMaterial: { type: DataTypes.STRING(14), allowNull: false },
				closureType: { type: DataTypes.STRING(24), allowNull: false },
				sealType: { type: DataTypes.STRING(10), allowNull: false },
				hazards: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
				nextCheckDue: { type: DataTypes.DATEONLY, allowNull: true },
				currentGrade: { type: DataTypes.STRING(12), allowNull: true },
				currentPriority: { type: DataTypes.STRING(8), allowNull: true },
				lastCheckedOn: { type: DataTypes.DATEONLY, allowNull: true },
				version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
				createdAt: DataTypes.DATE,
				updatedAt: DataTypes.DATE,
				deletedAt: { type: DataTypes.DATE, allowNull: true },
			},
			{ sequelize, tableName: 'specimens', paranoid: true, version: true },
		);
	}
}
