import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'
import type { LengthUnit } from '#shared/types/stock'

export class Swatch extends Model<InferAttributes<Swatch>, InferCreationAttributes<Swatch>> {
  declare id: CreationOptional<number>
  declare studioId: number
  declare machineId: number | null
  declare stitchSize: CreationOptional<string>
  declare mainYarnId: number | null
  declare contrastYarnId: number | null
  declare stitches: number
  declare rows: number
  declare width: number
  declare height: number
  declare unit: LengthUnit
  declare grams: number | null
  declare washed: CreationOptional<boolean>
  declare notes: CreationOptional<string>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>

  static initModel(sequelize: Sequelize) {
    Swatch.init({
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      studioId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      machineId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      stitchSize: { type: DataTypes.STRING(60), allowNull: false, defaultValue: '' },
      mainYarnId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      contrastYarnId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      stitches: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false },
      rows: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false },
      width: { type: DataTypes.DECIMAL(7, 2), allowNull: false },
      height: { type: DataTypes.DECIMAL(7, 2), allowNull: false },
      unit: { type: DataTypes.ENUM('cm', 'in'), allowNull: false },
      grams: { type: DataTypes.DECIMAL(8, 2), allowNull: true },
      washed: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
      createdAt: DataTypes.DATE(3),
      updatedAt: DataTypes.DATE(3),
    }, { sequelize, tableName: 'swatches' })
  }
}
