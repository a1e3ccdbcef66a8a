import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export type DerivativeKind = 'thumbnail' | 'display' | 'tiles';

/** One file (or, for tiles, one folder with its info.json) made from a master; replaced as a set. */
export class PhotoDerivative extends Model<InferAttributes<PhotoDerivative>, InferCreationAttributes<PhotoDerivative>> {
	declare id: CreationOptional<number>;
	declare photoId: string;
	declare kind: DerivativeKind;
	declare setId: string;
	declare path: string;
	declare mediaType: string;
	declare width: number;
	declare height: number;
	declare byteSize: number;
	declare createdAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		PhotoDerivative.init(
			{
				id: { type: DataTypes.BIGINT, primaryKey: true, autoIncrement: true },
				photoId: { type: DataTypes.UUID, allowNull: false },
				kind: { type: DataTypes.STRING(12), allowNull: false },
				setId: { type: DataTypes.STRING(40), allowNull: false },
				path: { type: DataTypes.STRING(300), allowNull: false },
				mediaType: { type: DataTypes.STRING(40), allowNull: false },
				width: { type: DataTypes.INTEGER, allowNull: false },
				height: { type: DataTypes.INTEGER, allowNull: false },
				byteSize: { type: DataTypes.BIGINT, allowNull: false, get() { return Number(this.getDataValue('byteSize')); } },
				createdAt: DataTypes.DATE,
			},
			{ sequelize, tableName: 'photo_derivatives', updatedAt: false },
		);
	}
}
