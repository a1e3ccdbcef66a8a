import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { Part } from '../../check/vocabulary.ts';

/** A damage term an administrator added to a part's vocabulary (beside the built-in ones). */
export class DamageTerm extends Model<InferAttributes<DamageTerm>, InferCreationAttributes<DamageTerm>> {
	declare id: CreationOptional<string>;
	declare part: Part;
	declare term: string;
	declare active: CreationOptional<boolean>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		DamageTerm.init(
			{
				id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
				part: { type: DataTypes.STRING(12), allowNull: false },
				term: { type: DataTypes.STRING(60), allowNull: false },
				active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
				createdAt: DataTypes.DATE,
				updatedAt: DataTypes.DATE,
			},
			{ sequelize, tableName: 'damage_terms' },
		);
	}
}
