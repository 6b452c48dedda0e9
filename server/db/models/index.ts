import type { Sequelize } from 'sequelize'
import { User } from './user'
import { Studio } from './studio'
import { Membership } from './membership'
import { Invitation } from './invitation'
import { PasswordReset } from './passwordReset'
import { SignInFailure } from './signInFailure'
import { Machine } from './machine'
import { Yarn } from './yarn'
import { Motif } from './motif'
import { Project } from './project'
import { Piece } from './piece'
import { RowEvent } from './rowEvent'
import { Swatch } from './swatch'
import { Plan, PlanPiece } from './plan'
import { UserSession } from './userSession'
import { EmailConfirmation } from './emailConfirmation'
import { QueuedMail } from './queuedMail'

export {
  User, Studio, Membership, Invitation, PasswordReset, SignInFailure, Machine, Yarn, Motif,
  Project, Piece, RowEvent, Swatch, Plan, PlanPiece, UserSession, EmailConfirmation, QueuedMail,
}

const models = [
  User, Studio, Membership, Invitation, PasswordReset, SignInFailure, Machine, Yarn, Motif,
  Project, Piece, RowEvent, Swatch, Plan, PlanPiece, UserSession, EmailConfirmation, QueuedMail,
]

/** Binds every model to one Sequelize instance (once per instance). */
export function initModels(sequelize: Sequelize) {
  for (const model of models) model.initModel(sequelize)
  Membership.belongsTo(Studio, { foreignKey: 'studioId' })
  Membership.belongsTo(User, { foreignKey: 'userId' })
  Studio.hasMany(Membership, { foreignKey: 'studioId' })
  User.hasMany(Membership, { foreignKey: 'userId' })
  Invitation.belongsTo(Studio, { foreignKey: 'studioId' })
  Project.hasMany(Piece, { foreignKey: 'projectId', as: 'pieces' })
  Project.belongsTo(User, { foreignKey: 'knitterId', as: 'knitter' })
  Piece.belongsTo(Project, { foreignKey: 'projectId', as: 'project' })
  RowEvent.belongsTo(Piece, { foreignKey: 'pieceId' })
  Motif.belongsTo(User, { foreignKey: 'createdBy', as: 'creator', constraints: false })
  Motif.belongsTo(User, { foreignKey: 'updatedBy', as: 'editor', constraints: false })
  Plan.hasMany(PlanPiece, { foreignKey: 'planId', as: 'pieces' })
  Plan.belongsTo(User, { foreignKey: 'createdBy', as: 'creator', constraints: false })
  Plan.belongsTo(User, { foreignKey: 'updatedBy', as: 'editor', constraints: false })
}
