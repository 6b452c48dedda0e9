import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from 'sequelize'
import type { PieceTimeline } from '#shared/piece/types'
import type { Project } from './project'
import { parsedJson } from './json'

export class Piece extends Model<InferAttributes<Piece>, InferCreationAttributes<Piece>> {
  declare id: CreationOptional<number>
  declare projectId: number
  declare name: string
  declare position: number
  declare timeline: PieceTimeline
  /** Machine rows of the compiled timeline. */
  declare totalRows: number
  declare completedRows: CreationOptional<number>
  /** Goes up by one with every applied row event; a step must build on the current one. */
  declare version: CreationOptional<number>
  declare lastDeviceId: CreationOptional<string | null>
  declare lastKnittedAt: CreationOptional<Date | null>
  declare finishedAt: CreationOptional<Date | null>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>

  declare project?: NonAttribute<Project>

  static initModel(sequelize: Sequelize) {
    Piece.init({
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      projectId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      name: { type: DataTypes.STRING(120), allowNull: false },
      position: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false },
      timeline: {
        type: DataTypes.JSON, allowNull: false,
        get() { return parsedJson<PieceTimeline>(this.getDataValue('timeline')) },
      },
      totalRows: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      completedRows: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
      version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
      lastDeviceId: { type: DataTypes.STRING(64), allowNull: true },
      lastKnittedAt: { type: DataTypes.DATE(3), allowNull: true },
      finishedAt: { type: DataTypes.DATE(3), allowNull: true },
      createdAt: DataTypes.DATE(3),
      updatedAt: DataTypes.DATE(3),
    }, { sequelize, tableName: 'pieces' })
  }
}
