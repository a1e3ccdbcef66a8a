import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** A place a jar can stand: a store, a room, a bay and shelf; the admin keeps the list. */
export class StorageLocation extends Model<InferAttributes<StorageLocation>, InferCreationAttributes<StorageLocation>> {
	declare id: CreationOptional<string>;
	declare code: string;
	declare name: string;
	declare notes: CreationOptional<string>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		StorageLocation.init(
			{
				id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
				code: { type: DataTypes.STRING(40), allowNull: false, unique: true },
				name: { type: DataTypes.STRING(200), allowNull: false },
				notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
				createdAt: DataTypes.DATE,
				updatedAt: DataTypes.DATE,
			},
			{ sequelize, tableName: 'storage_locations' },
		);
	}
}
