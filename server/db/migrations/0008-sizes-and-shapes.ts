import { DataTypes, type QueryInterface } from 'sequelize'

// Plans get sizes and pieces a shape (shared/types/plan.ts, PieceShape). A stored plan becomes
// a one-size plan whose pieces stay rectangles (shape null: the sections decide the rows, as
// before), so its numbers do not move. Projects are untouched: their timelines were frozen when
// they were made and carry no shape.
export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.addColumn('plans', 'sizes', { type: DataTypes.JSON, allowNull: true })
  await qi.sequelize.query(`UPDATE plans SET sizes = '["One size"]' WHERE sizes IS NULL`)
  await qi.changeColumn('plans', 'sizes', { type: DataTypes.JSON, allowNull: false })
  await qi.addColumn('plan_pieces', 'shape', { type: DataTypes.JSON, allowNull: true })
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.removeColumn('plan_pieces', 'shape')
  await qi.removeColumn('plans', 'sizes')
}
