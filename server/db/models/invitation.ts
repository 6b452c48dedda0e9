import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'
import type { StudioRole } from '#shared/types/studio'

export class Invitation extends Model<InferAttributes<Invitation>, InferCreationAttributes<Invitation>> {
  declare id: CreationOptional<number>
  declare studioId: number
  declare email: string
  declare role: StudioRole
  declare tokenHash: string
  declare invitedBy: number | null
  declare expiresAt: Date
  declare acceptedAt: CreationOptional<Date | null>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>

  static initModel(sequelize: Sequelize) {
    Invitation.init({
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      studioId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      email: { type: DataTypes.STRING(254), allowNull: false },
      role: { type: DataTypes.ENUM('owner', 'designer', 'knitter'), allowNull: false },
      tokenHash: { type: DataTypes.CHAR(64), allowNull: false, unique: true },
      invitedBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      expiresAt: { type: DataTypes.DATE(3), allowNull: false },
      acceptedAt: { type: DataTypes.DATE(3), allowNull: true },
      createdAt: DataTypes.DATE(3),
      updatedAt: DataTypes.DATE(3),
    }, { sequelize, tableName: 'invitations' })
  }
}
