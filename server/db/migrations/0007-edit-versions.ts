import { DataTypes, type QueryInterface } from 'sequelize'

// Motifs and plans count their changes, so an edit made from an old copy is refused (409)
// instead of silently overwriting someone else's: every change bumps `version` in the same
// UPDATE that checks it (DEVELOPERS.md, "Edits that cannot overwrite each other").
const counter = { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 }

export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.addColumn('motifs', 'version', counter)
  await qi.addColumn('plans', 'version', counter)
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.removeColumn('plans', 'version')
  await qi.removeColumn('motifs', 'version')
}
