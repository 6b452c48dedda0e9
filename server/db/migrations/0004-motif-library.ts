import { DataTypes, type QueryInterface } from 'sequelize'

// The motif library sorts and filters by verdict and longest float, so they are columns
// (kept beside float_report, which stays the full record); picture_type says whether the
// original picture a motif was made from is kept (in Nitro storage, keyed by motif id).
export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.addColumn('motifs', 'verdict', { type: DataTypes.ENUM('tidy', 'moderate', 'long'), allowNull: true })
  await qi.addColumn('motifs', 'longest_float', { type: DataTypes.SMALLINT.UNSIGNED, allowNull: true })
  await qi.addColumn('motifs', 'picture_type', { type: DataTypes.STRING(16), allowNull: true })
  await qi.sequelize.query(`
    UPDATE motifs SET
      verdict = JSON_UNQUOTE(JSON_EXTRACT(float_report, '$.verdict')),
      longest_float = GREATEST(JSON_EXTRACT(float_report, '$.maxFloat[0]'), JSON_EXTRACT(float_report, '$.maxFloat[1]'))
    WHERE float_report IS NOT NULL`)
  await qi.addIndex('motifs', ['studio_id', 'updated_at'])
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.removeIndex('motifs', ['studio_id', 'updated_at'])
  await qi.removeColumn('motifs', 'picture_type')
  await qi.removeColumn('motifs', 'longest_float')
  await qi.removeColumn('motifs', 'verdict')
}
