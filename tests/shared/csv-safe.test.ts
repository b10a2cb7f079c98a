import { describe, it, expect } from 'vitest';
import Papa from 'papaparse';
import { neutraliseCell, toSafeCsv } from '@shared/csv-safe';

// OWASP "CSV Injection": cells beginning with = + - @ tab or CR are run as formulas by spreadsheets.
describe('toSafeCsv', () => {
  it('text cells starting with a formula character, when exported, get a leading apostrophe', () => {
    const csv = toSafeCsv(['v'], [['=HYPERLINK("x")'], ['+1'], ['-2+3'], ['@SUM(A1)'], ['\tcmd'], ['\r=1'], ['=a\nb']]);
    const cells = Papa.parse<string[]>(csv, { skipEmptyLines: true }).data.slice(1).map((r) => r[0]);
    expect(cells).toEqual(["'=HYPERLINK(\"x\")", "'+1", "'-2+3", "'@SUM(A1)", "'\tcmd", "'\r=1", "'=a\nb"]);
  });

  it('ordinary text and numbers, when exported, are written unchanged', () => {
    const csv = toSafeCsv(['name', 'lux', 'note'], [['Reading room', -3, null], ['Office, A', 512.5, 'ok = fine']]);
    expect(csv).toBe('name,lux,note\r\nReading room,-3,\r\n"Office, A",512.5,ok = fine');
  });

  it('neutraliseCell, given safe text, returns it as it is', () => {
    expect(neutraliseCell('Corridor')).toBe('Corridor');
    expect(neutraliseCell('-5 lx')).toBe("'-5 lx");
  });
});
