import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type NonAttribute,
  type Sequelize,
} from 'sequelize';
import type { Role } from '../../shared/schemas/roles';
import type { LabModel } from './lab';
import type { UserModel } from './user';

export class MembershipModel extends Model<
  InferAttributes<MembershipModel>,
  InferCreationAttributes<MembershipModel>
> {
  declare id: CreationOptional<string>;
  declare labId: string;
  declare userId: string;
  declare role: Role;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare lab?: NonAttribute<LabModel>;
  declare user?: NonAttribute<UserModel>;

  static initModel(sequelize: Sequelize): void {
    MembershipModel.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        labId: { type: DataTypes.UUID, allowNull: false },
        userId: { type: DataTypes.UUID, allowNull: false },
        role: { type: DataTypes.TEXT, allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'memberships', modelName: 'Membership' },
    );
  }
}
