import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { Role } from '../../auth/roles.ts';

export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
	declare id: CreationOptional<string>;
	declare email: string;
	declare name: string;
	declare role: Role;
	/** Argon2id PHC string; null until the invited person sets a password. */
	declare passwordHash: string | null;
	declare disabled: CreationOptional<boolean>;
	declare lastSignInAt: Date | null;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		User.init(
			{
				id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
				email: { type: DataTypes.STRING(254), allowNull: false, unique: true },
				name: { type: DataTypes.STRING(120), allowNull: false },
				role: { type: DataTypes.STRING(20), allowNull: false },
				passwordHash: { type: DataTypes.TEXT, allowNull: true },
				disabled: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
				lastSignInAt: { type: DataTypes.DATE, allowNull: true },
				createdAt: DataTypes.DATE,
				updatedAt: DataTypes.DATE,
			},
			{ sequelize, tableName: 'users' },
		);
	}
}
