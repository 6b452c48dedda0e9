// A CSV reader for tests, written from RFC 4180 (published) rather than from our own writer, so
// it sees a file the way a spreadsheet does: fields split at commas, records at CRLF or LF, a
// field that opens with '"' runs to the closing '"' (commas and line breaks inside it included,
// '""' is one '"'). A quote inside an unquoted field is kept as a character, as spreadsheets do
// (RFC 4180 forbids it; the old motif header relied on it). Text after a closing quote is an error.

export function readCsv(text: string): string[][] {
  const records: string[][] = []
  let record: string[] = []
  let i = 0
  const atRecordEnd = () => i >= text.length || text[i] === '\n' || (text[i] === '\r' && text[i + 1] === '\n')
  while (i < text.length) {
    let field = ''
    if (text[i] === '"') {
      i++
      for (;;) {
        if (i >= text.length) throw new Error('a quoted field is not closed')
        if (text[i] === '"') {
          if (text[i + 1] === '"') { field += '"'; i += 2; continue }
          i++
          break
        }
        field += text[i++]
      }
      if (!atRecordEnd() && text[i] !== ',') throw new Error(`text after a closing quote at ${i}`)
    }
    else {
      while (!atRecordEnd() && text[i] !== ',') field += text[i++]
    }
    record.push(field)
    if (text[i] === ',') { i++; if (atRecordEnd()) record.push(''); else continue }
    if (i < text.length) i += text[i] === '\r' ? 2 : 1
    records.push(record)
    record = []
  }
  return records
}
