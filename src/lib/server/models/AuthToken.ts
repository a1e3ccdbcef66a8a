import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export type TokenPurpose = 'invite' | 'reset';

/** A single-use, expiring link sent by e-mail; only the token's SHA-256 is stored. */
export class AuthToken extends Model<InferAttributes<AuthToken>, InferCreationAttributes<AuthToken>> {
	declare id: CreationOptional<string>;
	declare userId: string;
	declare purpose: TokenPurpose;
	declare tokenHash: string;
	declare expiresAt: Date;
	declare usedAt: Date | null;
	declare createdAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		AuthToken.init(
			{
				id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
				userId: { type: DataTypes.UUID, allowNull: false },
				purpose: { type: DataTypes.STRING(10), allowNull: false },
				tokenHash: { type: DataTypes.STRING(64), allowNull: false, unique: true },
				expiresAt: { type: DataTypes.DATE, allowNull: false },
				usedAt: { type: DataTypes.DATE, allowNull: true },
				createdAt: DataTypes.DATE,
			},
			{ sequelize, tableName: 'auth_tokens', updatedAt: false },
		);
	}
}
