import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { CheckState, Grade, Part, Priority, Reason } from '../../check/vocabulary.ts';
import type { FluidReading } from '../../check/schema.ts';

export type PartRecord = { grade: Grade | null; terms: string[]; note: string };
/** A stored fluid reading, with the real strength computed when the check was saved. */
export type StoredFluid = FluidReading & { realPercentVol: number | null };

/** One condition check of one specimen: grades per part, the fluid, and its review. */
export class ConditionCheck extends Model<InferAttributes<ConditionCheck>, InferCreationAttributes<ConditionCheck>> {
	declare id: CreationOptional<string>;
	declare specimenId: string;
	declare checkedOn: string;
	declare examinerId: string;
	declare reason: Reason;
	declare state: CreationOptional<CheckState>;
	declare parts: Record<Part, PartRecord>;
	declare overallGrade: Grade | null;
	declare overallOverrideReason: string | null;
	declare priority: Priority | null;
	declare nextCheckDue: string | null;
	declare notes: CreationOptional<string>;
	declare fluid: StoredFluid | null;
	declare correctsCheckId: string | null;
	declare submittedAt: Date | null;
	declare reviewerId: string | null;
	declare reviewedAt: Date | null;
	declare reviewComment: string | null;
	declare version: CreationOptional<number>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		ConditionCheck.init(
			{
				id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
				specimenId: { type: DataTypes.UUID, allowNull: false },
				checkedOn: { type: DataTypes.DATEONLY, allowNull: false },
				examinerId: { type: DataTypes.UUID, allowNull: false },
				reason: { type: DataTypes.STRING(20), allowNull: false },
				state: { type: DataTypes.STRING(12), allowNull: false, defaultValue: 'draft' },
				parts: { type: DataTypes.JSONB, allowNull: false },
				overallGrade: { type: DataTypes.STRING(12), allowNull: true },
				overallOverrideReason: { type: DataTypes.TEXT, allowNull: true },
				priority: { type: DataTypes.STRING(8), allowNull: true },
				nextCheckDue: { type: DataTypes.DATEONLY, allowNull: true },
				notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
				fluid: { type: DataTypes.JSONB, allowNull: true },
				correctsCheckId: { type: DataTypes.UUID, allowNull: true },
				submittedAt: { type: DataTypes.DATE, allowNull: true },
				reviewerId: { type: DataTypes.UUID, allowNull: true },
				reviewedAt: { type: DataTypes.DATE, allowNull: true },
				reviewComment: { type: DataTypes.TEXT, allowNull: true },
				version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
				createdAt: DataTypes.DATE,
				updatedAt: DataTypes.DATE,
			},
			{ sequelize, tableName: 'condition_checks', version: true },
		);
	}
}
