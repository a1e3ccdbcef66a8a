import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { MarkLayer } from '../../marks/schema.ts';

/** The stored mark layer of one photograph (see src/lib/marks/schema.ts for the document). */
export class PhotoMarkLayer extends Model<InferAttributes<PhotoMarkLayer>, InferCreationAttributes<PhotoMarkLayer>> {
	declare photoId: string;
	declare layer: MarkLayer;
	declare markCount: number;
	declare version: CreationOptional<number>;
	declare updatedBy: string | null;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		PhotoMarkLayer.init(
			{
				photoId: { type: DataTypes.UUID, primaryKey: true },
				layer: { type: DataTypes.JSONB, allowNull: false },
				markCount: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
				version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
				updatedBy: { type: DataTypes.UUID, allowNull: true },
				createdAt: DataTypes.DATE,
				updatedAt: DataTypes.DATE,
			},
			{ sequelize, tableName: 'mark_layers' },
		);
	}
}
