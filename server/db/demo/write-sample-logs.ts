// Writes the sample logs in public/samples/ from the demo simulation: `npx tsx server/db/demo/write-sample-logs.ts`.
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import Papa from 'papaparse';
import { simulateDemoWalk, toLogCsv } from './simulate-log';

const dir = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../../public/samples');
fs.mkdirSync(dir, { recursive: true });

const walk = toLogCsv(simulateDemoWalk({ startMs: Date.parse('2026-11-18T09:00:00Z'), seed: 1118 }), 'Europe/London');
fs.writeFileSync(path.join(dir, 'library-walk.csv'), walk);

// The same kind of log as a spreadsheet in a decimal-comma locale saves it: BOM, semicolons, CRLF.
const short = toLogCsv(simulateDemoWalk({ startMs: Date.parse('2026-11-18T14:00:00Z'), seed: 1119 }).slice(0, 120), 'Europe/London');
const rows = Papa.parse<string[]>(short.trimEnd()).data.map((r) => r.map((cell) => (/^-?\d+\.\d+$/.test(cell) ? cell.replace('.', ',') : cell)));
const semicolon = `\uFEFF${Papa.unparse(rows, { delimiter: ';', newline: '\r\n' })}\r\n`;
fs.writeFileSync(path.join(dir, 'library-walk-semicolon.csv'), semicolon);

// A log with mistakes a surveyor can fix, one per line.
const broken = [
  'timestamp,probe,point,gain,counts,x_m,y_m,plan',
  '2026-11-18T09:00:00Z,LX-4102,RR-01,2,16011,1.2,1.2,Ground floor',
  '2026-11-18T09:00:30Z,LX-4102,RR-02,2,16a00,2.6,1.2,Ground floor',
  '18/11/2026 09:01,LX-4102,RR-03,2,15800,4.1,1.2,Ground floor',
  '2026-11-18T09:01:30Z,LX-9999,RR-04,2,15800,5.6,1.2,Ground floor',
  '2026-11-18T09:02:00Z,LX-4102,RR-05,9,15800,7.0,1.2,Ground floor',
  '2026-11-18T09:02:30Z,LX-4102,RR-06,2,15800,8.5,,Ground floor',
  '2026-11-18T09:03:00Z,LX-4102,RR-07,2,15800,10.0,1.2,Basement',
  '',
].join('\n');
fs.writeFileSync(path.join(dir, 'broken-log.csv'), broken);
console.log(`Wrote ${dir}/library-walk.csv (${walk.split('\n').length - 2} rows), library-walk-semicolon.csv, broken-log.csv`);
