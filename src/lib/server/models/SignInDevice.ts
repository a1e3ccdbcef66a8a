import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** A browser a user has signed in from: the SHA-256 of its device token (the token is only in the cookie). */
export class SignInDevice extends Model<InferAttributes<SignInDevice>, InferCreationAttributes<SignInDevice>> {
	declare tokenHash: string;
	declare userId: string;
	declare createdAt: CreationOptional<Date>;
	declare expiresAt: Date;

	static initModel(sequelize: Sequelize) {
		SignInDevice.init(
			{
				tokenHash: { type: DataTypes.CHAR(64), primaryKey: true },
				userId: { type: DataTypes.UUID, allowNull: false },
				createdAt: DataTypes.DATE,
				expiresAt: { type: DataTypes.DATE, allowNull: false },
			},
			{ sequelize, tableName: 'sign_in_devices', updatedAt: false },
		);
	}
}
