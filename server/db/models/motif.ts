import type { FloatVerdict } from '#shared/engine'
import type { MotifFloatReport } from '#shared/types/motif'
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from 'sequelize'
import { parsedJson } from './json'
import type { User } from './user'

export class Motif extends Model<InferAttributes<Motif>, InferCreationAttributes<Motif>> {
  declare id: CreationOptional<number>
  declare studioId: number
  declare name: string
  declare width: number
  declare height: number
  /** One character per cell, '0' main and '1' contrast, row 0 (first knitted) first. */
  declare cells: string
  declare published: CreationOptional<boolean>
  declare floatReport: CreationOptional<MotifFloatReport | null>
  /** From floatReport, as columns so the library can sort and filter by them. */
  declare verdict: CreationOptional<FloatVerdict | null>
  declare longestFloat: CreationOptional<number | null>
  /** MIME type of the kept original picture, or null when there is none. */
  declare pictureType: CreationOptional<string | null>
  /** Bumped by every change, in the UPDATE that checks it (server/utils/editVersions.ts). */
  declare version: CreationOptional<number>
  declare createdBy: number | null
  declare updatedBy: number | null
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
  declare creator?: NonAttribute<User | null>
  declare editor?: NonAttribute<User | null>

  static initModel(sequelize: Sequelize) {
    Motif.init({
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      studioId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      name: { type: DataTypes.STRING(120), allowNull: false },
      width: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false },
      height: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false },
      cells: { type: DataTypes.TEXT('medium'), allowNull: false },
      published: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      floatReport: {
        type: DataTypes.JSON, allowNull: true,
        get() { return parsedJson<MotifFloatReport | null>(this.getDataValue('floatReport')) ?? null },
      },
      verdict: { type: DataTypes.ENUM('tidy', 'moderate', 'long'), allowNull: true },
      longestFloat: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: true },
      pictureType: { type: DataTypes.STRING(16), allowNull: true },
      version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
      createdBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      updatedBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      createdAt: DataTypes.DATE(3),
      updatedAt: DataTypes.DATE(3),
    }, { sequelize, tableName: 'motifs' })
  }
}
