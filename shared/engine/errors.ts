// Invalid input to the knitting engine. `field`, `row` and `col` say where,
// so the app can show the message next to the right input or chart cell.
export class KnittingInputError extends Error {
  field?: string
  row?: number
  col?: number

  constructor(message: string, details?: { field?: string; row?: number; col?: number }) {
    super(message)
    this.name = 'KnittingInputError'
    this.field = details?.field
    this.row = details?.row
    this.col = details?.col
  }
}
