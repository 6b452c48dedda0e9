// Our own motif files: the versioned JSON format and a CSV of 0/1 cells (README, "Motif file
// format"). Plain functions over chart rows, so the app can read and write them offline too.
//
// Rows are in the chart's order: rows[0] is the first row knitted, and so is the first row
// of a file. Cells are written '0' (main colour) and '1' (contrast colour).

import { z } from 'zod'
import type { MotifFile } from '../types/motif'

export const MOTIF_FILE_FORMAT = 'floatwise-motif'
export const MOTIF_FILE_VERSION = 1

/** A file we cannot read; `line` and `column` (from 1) say where, when known. */
export class MotifFileError extends Error {
  line?: number
  column?: number
  constructor(message: string, where: { line?: number; column?: number } = {}) {
    super(message)
    this.name = 'MotifFileError'
    this.line = where.line
    this.column = where.column
  }
}

/** '.'/'x' (or any chartFromRows characters) → '0'/'1'. */
function digitRow(row: string): string {
  return row.replace(/[.0]/g, '0').replace(/[xX#1]/g, '1')
}

export function motifToJson(name: string, rows: string[]): string {
  const file: MotifFile = {
    format: MOTIF_FILE_FORMAT, version: MOTIF_FILE_VERSION, name,
    width: Array.from(rows[0] ?? '').length, height: rows.length, rows: rows.map(digitRow),
  }
  return `${JSON.stringify(file, null, 2)}\n`
}

export function motifToCsv(name: string, rows: string[]): string {
  const header = `# floatwise motif ${JSON.stringify(name)}, first line = first row knitted, 0 = main colour, 1 = contrast colour`
  return [header, ...rows.map(r => Array.from(digitRow(r)).join(','))].join('\n') + '\n'
}

const jsonFile = z.object({
  format: z.literal(MOTIF_FILE_FORMAT, `must be "${MOTIF_FILE_FORMAT}"`),
  version: z.number('must be a number'),
  name: z.string('must be text').optional(),
  width: z.number('must be a number').int('must be a whole number'),
  height: z.number('must be a number').int('must be a whole number'),
  rows: z.array(z.string('must be text'), 'must be a list of rows'),
})

/**
 * Reads our JSON motif file. Checks its own shape (format, version, width and height
 * matching the rows); the cells themselves are checked by the caller with the chart schema.
 */
export function motifFromJson(content: string): { name?: string; rows: string[] } {
  let data: unknown
  try { data = JSON.parse(content) }
  catch (e) { throw new MotifFileError(`not valid JSON (${(e as Error).message})`) }
  const parsed = jsonFile.safeParse(data)
  if (!parsed.success) {
    const issue = parsed.error.issues[0]!
    throw new MotifFileError(`${issue.path.join('.') || 'file'}: ${issue.message}`)
  }
  const file = parsed.data
  if (file.version !== MOTIF_FILE_VERSION) {
    throw new MotifFileError(`version ${file.version} is not one this server reads (it reads version ${MOTIF_FILE_VERSION})`)
  }
  if (file.height !== file.rows.length) {
    throw new MotifFileError(`height is ${file.height} but the file has ${file.rows.length} rows`)
  }
  const width = Array.from(file.rows[0] ?? '').length
  if (file.width !== width) {
    throw new MotifFileError(`width is ${file.width} but row 1 has ${width} stitches`)
  }
  return { name: file.name, rows: file.rows }
}

/**
 * Reads a CSV motif: one line per row, first line = first row knitted, cells 0 or 1
 * separated by commas (spaces around them are allowed). Lines starting with '#' and blank
 * lines are skipped; our own header comment gives the name. Errors name the line and
 * column as a text editor counts them ("line 4, column 7: expected 0 or 1, got 2"),
 * where a column is a value between commas.
 */
export function motifFromCsv(content: string): { name?: string; rows: string[] } {
  const lines = content.replace(/^\uFEFF/, '').split(/\r?\n/)
  const rows: string[] = []
  let name: string | undefined
  let width = -1
  let firstLine = 0
  lines.forEach((line, index) => {
    const lineNo = index + 1
    if (line.trim() === '') return
    if (line.trimStart().startsWith('#')) {
      const named = /^#\s*floatwise motif ("(?:[^"\\]|\\.)*")/.exec(line.trim())
      if (named && name === undefined) {
        try { name = JSON.parse(named[1]!) as string }
        catch { /* a comment we do not understand names nothing */ }
      }
      return
    }
    const values = line.split(',').map(v => v.trim())
    let row = ''
    values.forEach((v, c) => {
      if (v !== '0' && v !== '1') {
        throw new MotifFileError(`line ${lineNo}, column ${c + 1}: expected 0 or 1, got ${v === '' ? 'nothing' : v.length > 12 ? `${v.slice(0, 12)}…` : v}`, { line: lineNo, column: c + 1 })
      }
      row += v
    })
    if (width < 0) {
      width = values.length
      firstLine = lineNo
    }
    else if (values.length !== width) {
      throw new MotifFileError(`line ${lineNo}: ${values.length} values, expected ${width} like line ${firstLine}`, { line: lineNo, column: Math.min(values.length, width) + 1 })
    }
    rows.push(row)
  })
  if (rows.length === 0) throw new MotifFileError('no rows: expected lines of 0 and 1 separated by commas')
  return { name, rows }
}
