import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'
import type { Technique } from '#shared/types/studio'

export class Machine extends Model<InferAttributes<Machine>, InferCreationAttributes<Machine>> {
  declare id: CreationOptional<number>
  declare studioId: number
  declare name: string
  declare needlePitchMm: number
  declare needles: number
  declare patterningWidth: number
  declare technique: CreationOptional<Technique>
  declare passesPerColour: CreationOptional<number>
  declare notes: CreationOptional<string>
  declare cardReader: CreationOptional<boolean>
  declare cardHolePitchMm: CreationOptional<number>
  declare cardRowPitchMm: CreationOptional<number>
  declare cardEdgeMm: CreationOptional<number>
  declare cardMinRows: CreationOptional<number>
  declare cardJoinRows: CreationOptional<number>
  declare cardReaderOffset: CreationOptional<number>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>

  static initModel(sequelize: Sequelize) {
    Machine.init({
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      studioId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      name: { type: DataTypes.STRING(120), allowNull: false },
      needlePitchMm: { type: DataTypes.DECIMAL(5, 2), allowNull: false },
      needles: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false },
      patterningWidth: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false },
      technique: { type: DataTypes.ENUM('together', 'colour-by-colour'), allowNull: false, defaultValue: 'together' },
      passesPerColour: { type: DataTypes.TINYINT.UNSIGNED, allowNull: false, defaultValue: 2 },
      notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
      // The punch card (migration 0009; MachineCard in shared/types/stock.ts).
      cardReader: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
      cardHolePitchMm: { type: DataTypes.DECIMAL(4, 2), allowNull: false, defaultValue: 4.5 },
      cardRowPitchMm: { type: DataTypes.DECIMAL(4, 2), allowNull: false, defaultValue: 5 },
      cardEdgeMm: { type: DataTypes.DECIMAL(4, 2), allowNull: false, defaultValue: 6 },
      cardMinRows: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false, defaultValue: 36 },
      cardJoinRows: { type: DataTypes.TINYINT.UNSIGNED, allowNull: false, defaultValue: 2 },
      cardReaderOffset: { type: DataTypes.TINYINT.UNSIGNED, allowNull: false, defaultValue: 0 },
      createdAt: DataTypes.DATE(3),
      updatedAt: DataTypes.DATE(3),
    }, { sequelize, tableName: 'machines' })
  }
}
