import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** Failed sign-ins counted per key (`account:<email>` or `address:<ip>`). */
export class LoginThrottle extends Model<InferAttributes<LoginThrottle>, InferCreationAttributes<LoginThrottle>> {
	declare key: string;
	declare failures: number;
	declare windowStart: Date;
	declare blockedUntil: Date | null;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		LoginThrottle.init(
			{
				key: { type: DataTypes.STRING(320), primaryKey: true },
				failures: { type: DataTypes.INTEGER, allowNull: false },
				windowStart: { type: DataTypes.DATE, allowNull: false },
				blockedUntil: { type: DataTypes.DATE, allowNull: true },
				updatedAt: DataTypes.DATE,
			},
			{ sequelize, tableName: 'login_throttles', createdAt: false },
		);
	}
}
