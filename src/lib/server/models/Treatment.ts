import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { RiskState, TreatmentState } from '../../treatment/vocabulary.ts';
import type { Risk } from '../../treatment/schema.ts';
import type { StepView } from '../../treatment/view.ts';

/** A stored step: what the form sent plus what the server derived when it was saved. */
export type StoredStep = StepView;

/** One treatment of one specimen: its plan, its risk assessment and the sign-off. */
export class Treatment extends Model<InferAttributes<Treatment>, InferCreationAttributes<Treatment>> {
	declare id: CreationOptional<string>;
	declare specimenId: string;
	declare title: string;
	declare purpose: CreationOptional<string>;
	declare beforeCheckId: string | null;
	declare afterCheckId: string | null;
	declare state: CreationOptional<TreatmentState>;
	declare steps: StoredStep[];
	declare risk: Risk;
	declare riskState: CreationOptional<RiskState>;
	declare riskSubmittedAt: Date | null;
	declare riskReviewerId: string | null;
	declare riskReviewedAt: Date | null;
	declare riskReviewComment: string | null;
	declare completedAt: Date | null;
	declare createdBy: string;
	declare updatedBy: string;
	declare version: CreationOptional<number>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		Treatment.init(
			{
				id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
				specimenId: { type: DataTypes.UUID, allowNull: false },
				title: { type: DataTypes.STRING(200), allowNull: false },
				purpose: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
				beforeCheckId: { type: DataTypes.UUID, allowNull: true },
				afterCheckId: { type: DataTypes.UUID, allowNull: true },
				state: { type: DataTypes.STRING(12), allowNull: false, defaultValue: 'planning' },
				steps: { type: DataTypes.JSONB, allowNull: false },
				risk: { type: DataTypes.JSONB, allowNull: false },
				riskState: { type: DataTypes.STRING(12), allowNull: false, defaultValue: 'draft' },
				riskSubmittedAt: { type: DataTypes.DATE, allowNull: true },
				riskReviewerId: { type: DataTypes.UUID, allowNull: true },
				riskReviewedAt: { type: DataTypes.DATE, allowNull: true },
				riskReviewComment: { type: DataTypes.TEXT, allowNull: true },
				completedAt: { type: DataTypes.DATE, allowNull: true },
				createdBy: { type: DataTypes.UUID, allowNull: false },
				updatedBy: { type: DataTypes.UUID, allowNull: false },
				version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
				createdAt: DataTypes.DATE,
				updatedAt: DataTypes.DATE,
			},
			{ sequelize, tableName: 'treatments', version: true },
		);
	}
}
