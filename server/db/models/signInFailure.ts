import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'

// One row per failed sign-in; kept in the database so throttling holds across servers.
export class SignInFailure extends Model<InferAttributes<SignInFailure>, InferCreationAttributes<SignInFailure>> {
  declare id: CreationOptional<number>
  declare email: string
  declare address: string
  declare at: Date

  static initModel(sequelize: Sequelize) {
    SignInFailure.init({
      id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
      email: { type: DataTypes.STRING(254), allowNull: false },
      address: { type: DataTypes.STRING(64), allowNull: false },
      at: { type: DataTypes.DATE(3), allowNull: false },
    }, { sequelize, tableName: 'sign_in_failures', timestamps: false })
  }
}
