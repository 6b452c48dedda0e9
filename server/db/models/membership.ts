import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'
import type { StudioRole } from '#shared/types/studio'

export class Membership extends Model<InferAttributes<Membership>, InferCreationAttributes<Membership>> {
  declare studioId: number
  declare userId: number
  declare role: StudioRole
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>

  static initModel(sequelize: Sequelize) {
    Membership.init({
      studioId: { type: DataTypes.INTEGER.UNSIGNED, primaryKey: true },
      userId: { type: DataTypes.INTEGER.UNSIGNED, primaryKey: true },
      role: { type: DataTypes.ENUM('owner', 'designer', 'knitter'), allowNull: false },
      createdAt: DataTypes.DATE(3),
      updatedAt: DataTypes.DATE(3),
    }, { sequelize, tableName: 'memberships' })
  }
}
