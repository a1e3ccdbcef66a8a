import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/**
 * A place a jar can stand: a store, a room, a bay and shelf; the admin keeps the list, with the
 * store's flammable volume limit and its expected temperature range where they are known. DECIMAL
 * columns come back from pg as strings; the getters turn them into numbers.
 */
export class StorageLocation extends Model<InferAttributes<StorageLocation>, InferCreationAttributes<StorageLocation>> {
	declare id: CreationOptional<string>;
	declare code: string;
	declare name: string;
	declare notes: CreationOptional<string>;
	/** Litres of flammable fluid the store may hold (the organisation's own figure); null: not set. */
	declare flammableLimitL: CreationOptional<number | null>;
	/** The share of the limit, in %, at which the store counts as near it. */
	declare nearLimitPercent: CreationOptional<number>;
	declare tempMinC: CreationOptional<number | null>;
	declare tempMaxC: CreationOptional<number | null>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		const decimal = (field: 'flammableLimitL' | 'tempMinC' | 'tempMaxC', precision: number, scale: number) => ({
			type: DataTypes.DECIMAL(precision, scale),
			allowNull: true,
			get(this: StorageLocation) {
				const raw = this.getDataValue(field) as unknown;
				return raw === null || raw === undefined ? null : Number(raw);
			},
		});
		StorageLocation.init(
			{
				id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
				code: { type: DataTypes.STRING(40), allowNull: false, unique: true },
				name: { type: DataTypes.STRING(200), allowNull: false },
				notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
				flammableLimitL: decimal('flammableLimitL', 9, 1),
				nearLimitPercent: { type: DataTypes.SMALLINT, allowNull: false, defaultValue: 80 },
				tempMinC: decimal('tempMinC', 4, 1),
				tempMaxC: decimal('tempMaxC', 4, 1),
				createdAt: DataTypes.DATE,
				updatedAt: DataTypes.DATE,
			},
			{ sequelize, tableName: 'storage_locations' },
		);
	}
}
