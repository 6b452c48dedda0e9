import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'

// One signed-in device. The sealed cookie carries the session id; only its hash is kept here.
export class UserSession extends Model<InferAttributes<UserSession>, InferCreationAttributes<UserSession>> {
  declare id: CreationOptional<number>
  declare userId: number
  declare sidHash: string
  declare device: string
  declare address: string
  declare lastSeenAt: Date
  declare endedAt: CreationOptional<Date | null>
  declare endReason: CreationOptional<string | null>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>

  static initModel(sequelize: Sequelize) {
    UserSession.init({
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      userId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      sidHash: { type: DataTypes.CHAR(64), allowNull: false, unique: true },
      device: { type: DataTypes.STRING(120), allowNull: false, defaultValue: '' },
      address: { type: DataTypes.STRING(64), allowNull: false, defaultValue: '' },
      lastSeenAt: { type: DataTypes.DATE(3), allowNull: false },
      endedAt: { type: DataTypes.DATE(3), allowNull: true },
      endReason: { type: DataTypes.STRING(40), allowNull: true },
      createdAt: DataTypes.DATE(3),
      updatedAt: DataTypes.DATE(3),
    }, { sequelize, tableName: 'user_sessions' })
  }
}
