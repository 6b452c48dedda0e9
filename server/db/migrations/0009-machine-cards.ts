import { DataTypes, type QueryInterface } from 'sequelize'

// A machine's punch card: whether it patterns from one, the card's hole and row pitch, its edge
// beyond the outer holes, the shortest loop that goes round the reader, the join rows, and how
// many rows ahead of the row knitted the reader reads. Every stored machine gets the starting
// values the card page used (common practice for standard-gauge cards, from memory; the page
// asks the knitter to measure a blank card), so nothing a knitter sees moves.
const cardColumns = {
  card_reader: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
  card_hole_pitch_mm: { type: DataTypes.DECIMAL(4, 2), allowNull: false, defaultValue: 4.5 },
  card_row_pitch_mm: { type: DataTypes.DECIMAL(4, 2), allowNull: false, defaultValue: 5 },
  card_edge_mm: { type: DataTypes.DECIMAL(4, 2), allowNull: false, defaultValue: 6 },
  card_min_rows: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false, defaultValue: 36 },
  card_join_rows: { type: DataTypes.TINYINT.UNSIGNED, allowNull: false, defaultValue: 2 },
  card_reader_offset: { type: DataTypes.TINYINT.UNSIGNED, allowNull: false, defaultValue: 0 },
} as const

export async function up({ context: qi }: { context: QueryInterface }) {
  for (const [name, column] of Object.entries(cardColumns)) await qi.addColumn('machines', name, column)
}

export async function down({ context: qi }: { context: QueryInterface }) {
  for (const name of Object.keys(cardColumns).reverse()) await qi.removeColumn('machines', name)
}
