import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { MaterialKind } from '../../treatment/vocabulary.ts';

/** A material on the organisation's list; a sealant's cure period drives the cure timers. */
export class TreatmentMaterial extends Model<InferAttributes<TreatmentMaterial>, InferCreationAttributes<TreatmentMaterial>> {
	declare id: CreationOptional<string>;
	declare kind: MaterialKind;
	declare name: string;
	/** DECIMAL comes back from pg as a string; the presenter turns it into a number. */
	declare cureHours: string | number | null;
	declare note: CreationOptional<string>;
	declare active: CreationOptional<boolean>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		TreatmentMaterial.init(
			{
				id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
				kind: { type: DataTypes.STRING(12), allowNull: false },
				name: { type: DataTypes.STRING(200), allowNull: false },
				cureHours: { type: DataTypes.DECIMAL(7, 2), allowNull: true },
				note: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
				active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
				createdAt: DataTypes.DATE,
				updatedAt: DataTypes.DATE,
			},
			{ sequelize, tableName: 'treatment_materials' },
		);
	}
}
