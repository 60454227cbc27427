import {
  DataTypes,
  Model,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

/** Tries counted under one key (e.g. sign-in from one address) in the window ending at resetAt. */
export class RateLimitModel extends Model<
  InferAttributes<RateLimitModel>,
  InferCreationAttributes<RateLimitModel>
> {
  declare key: string;
  declare hits: number;
  declare resetAt: Date;

  static initModel(sequelize: Sequelize): void {
    RateLimitModel.init(
      {
        key: { type: DataTypes.TEXT, primaryKey: true },
        hits: { type: DataTypes.INTEGER, allowNull: false },
        resetAt: { type: DataTypes.DATE, allowNull: false },
      },
      { sequelize, tableName: 'rate_limits', modelName: 'RateLimit', timestamps: false },
    );
  }
}
