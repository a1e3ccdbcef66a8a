import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** Lucia's session rows; Lucia writes them, the app reads them (e.g. to end a user's sessions). */
export class UserSession extends Model<InferAttributes<UserSession>, InferCreationAttributes<UserSession>> {
	declare id: string;
	declare userId: string;
	declare expiresAt: Date;
	declare createdAt: CreationOptional<Date>;
	declare userAgent: string | null;

	static initModel(sequelize: Sequelize) {
		UserSession.init(
			{
				id: { type: DataTypes.TEXT, primaryKey: true },
				userId: { type: DataTypes.UUID, allowNull: false },
				expiresAt: { type: DataTypes.DATE, allowNull: false },
				createdAt: DataTypes.DATE,
				userAgent: { type: DataTypes.STRING(300), allowNull: true },
			},
			{ sequelize, tableName: 'user_sessions', updatedAt: false },
		);
	}
}
