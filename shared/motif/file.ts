// Our own motif files: the versioned JSON format and a CSV of 0/1 cells (README, "Motif file
// format"). Plain functions over chart rows, so the app can read and write them offline too.
//
// Rows are in the chart's order: rows[0] is the first row knitted, and so is the first row
// of a file. Cells are written '0' (main colour) and '1' (contrast colour).

import { z } from 'zod'
import type { MotifFile } from '#shared/types/motif'
import { quotedCsvCell, readQuotedCsvCell, unguardCsvCell } from './csvCell'

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

/** The CSV's comment after the name: semicolons, so it stays one cell. */
const CSV_HEADER_NOTE = 'first line = first row knitted; 0 = main colour; 1 = contrast colour'

/**
 * The header is three cells, `# floatwise motif`, the name and the note; the name is quoted
 * and guarded (csvCell.ts) so a spreadsheet shows it as text, never as a formula.
 */
export function motifToCsv(name: string, rows: string[]): string {
  const header = ['# floatwise motif', quotedCsvCell(name), CSV_HEADER_NOTE].join(',')
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

const endOfLine = (text: string, from: number) => {
  const at = text.indexOf('\n', from)
  return at < 0 ? text.length : at
}

/**
 * Our header comment starting at `start`: `# floatwise motif,"<name>",…` (the quoted name may
 * span lines), or the form written before the name was quoted for CSV,
 * `# floatwise motif "<JSON string>", …`, which files already exported still carry.
 * `end` is the end of the header's last line; a comment of anyone else's names nothing.
 */
function readCsvHeader(text: string, start: number, lineNo: number): { name?: string; end: number } {
  const lineEnd = endOfLine(text, start)
  const line = text.slice(start, lineEnd)
  const current = /^\s*#\s*floatwise motif[ \t]*,[ \t]*/.exec(line)
  if (current) {
    const at = start + current[0].length
    if (text[at] !== '"') return { name: unguardCsvCell(line.slice(current[0].length).split(',')[0]!.trim()), end: lineEnd }
    const cell = readQuotedCsvCell(text, at)
    if (!cell) throw new MotifFileError(`line ${lineNo}: the name's closing quote is missing`, { line: lineNo })
    return { name: cell.value, end: endOfLine(text, cell.end) }
  }
  const old = /^#\s*floatwise motif ("(?:[^"\\]|\\.)*")/.exec(line.trim())
  if (!old) return { end: lineEnd }
  try { return { name: JSON.parse(old[1]!) as string, end: lineEnd } }
  catch { return { end: lineEnd } }
}

/**
 * Reads a CSV motif: one line per row, first line = first row knitted, cells 0 or 1
 * separated by commas (spaces around them are allowed). Lines starting with '#' and blank
 * lines are skipped; our own header comment gives the name. Errors name the line and
 * column as a text editor counts them ("line 4, column 7: expected 0 or 1, got 2"),
 * where a column is a value between commas.
 */
export function motifFromCsv(content: string): { name?: string; rows: string[] } {
  const text = content.replace(/^\uFEFF/, '')
  const rows: string[] = []
  let name: string | undefined
  let width = -1
  let firstLine = 0
  let lineNo = 1
  for (let start = 0; start < text.length; lineNo++) {
    let end = endOfLine(text, start)
    const line = text.slice(start, end).replace(/\r$/, '')
    if (line.trimStart().startsWith('#')) {
      const header = readCsvHeader(text, start, lineNo)
      if (name === undefined) name = header.name
      // A name with line breaks: go on after the line its closing quote is on.
      lineNo += text.slice(start, header.end).split('\n').length - 1
      end = header.end
    }
    else if (line.trim() !== '') {
      const row = readCsvRow(line, lineNo)
      if (width < 0) {
        width = row.length
        firstLine = lineNo
      }
      else if (row.length !== width) {
        throw new MotifFileError(`line ${lineNo}: ${row.length} values, expected ${width} like line ${firstLine}`, {
          line: lineNo,
          column: Math.min(row.length, width) + 1,
        })
      }
      rows.push(row)
    }
    start = end + 1
  }
  if (rows.length === 0) throw new MotifFileError('no rows: expected lines of 0 and 1 separated by commas')
  return { name, rows }
}

/** One line of 0/1 values → a row of '0'/'1'. */
function readCsvRow(line: string, lineNo: number): string {
  const values = line.split(',').map(v => v.trim())
  values.forEach((v, c) => {
    if (v !== '0' && v !== '1') {
      throw new MotifFileError(`line ${lineNo}, column ${c + 1}: expected 0 or 1, got ${v === '' ? 'nothing' : v.length > 12 ? `${v.slice(0, 12)}…` : v}`, {
        line: lineNo,
        column: c + 1,
      })
    }
  })
  return values.join('')
}
