import type { MotifFloatReport } from '../../../shared/types/motif'
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'

export class Motif extends Model<InferAttributes<Motif>, InferCreationAttributes<Motif>> {
  declare id: CreationOptional<number>
  declare studioId: number
  declare name: string
  declare width: number
  declare height: number
  declare cells: string
  declare published: CreationOptional<boolean>
  declare floatReport: CreationOptional<MotifFloatReport | null>
  declare createdBy: number | null
  declare updatedBy: number | null
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>

  static initModel(sequelize: Sequelize) {
    Motif.init({
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      studioId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      name: { type: DataTypes.STRING(120), allowNull: false },
      width: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false },
      height: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false },
      cells: { type: DataTypes.TEXT('medium'), allowNull: false },
      published: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      floatReport: { type: DataTypes.JSON, allowNull: true },
      createdBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      updatedBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      createdAt: DataTypes.DATE(3),
      updatedAt: DataTypes.DATE(3),
    }, { sequelize, tableName: 'motifs' })
  }
}
