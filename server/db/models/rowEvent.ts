import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'
import type { RowEventKind, RowEventOutcome } from '#shared/piece/types'

/** One tap at the machine as the device recorded it, and what the server made of it. Never deleted. */
export class RowEvent extends Model<InferAttributes<RowEvent>, InferCreationAttributes<RowEvent>> {
  declare id: string
  /** Arrival order (AUTO_INCREMENT in the table; left to the database on insert). */
  declare seq: CreationOptional<number>
  declare pieceId: number
  declare userId: number
  declare deviceId: string
  declare kind: RowEventKind
  declare fromRows: number
  declare toRows: number
  /** The piece version the step was built on. */
  declare version: number
  /** Device time of the tap. */
  declare at: Date
  declare receivedAt: Date
  declare outcome: RowEventOutcome

  static initModel(sequelize: Sequelize) {
    RowEvent.init({
      id: { type: DataTypes.CHAR(36), primaryKey: true },
      seq: { type: DataTypes.BIGINT.UNSIGNED, allowNull: true },
      pieceId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      userId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      deviceId: { type: DataTypes.STRING(64), allowNull: false },
      kind: { type: DataTypes.ENUM('advance', 'back', 'jump'), allowNull: false },
      fromRows: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      toRows: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      at: { type: DataTypes.DATE(3), allowNull: false },
      receivedAt: { type: DataTypes.DATE(3), allowNull: false },
      outcome: { type: DataTypes.ENUM('applied', 'conflict', 'rejected'), allowNull: false },
    }, { sequelize, tableName: 'row_events', timestamps: false })
  }
}
