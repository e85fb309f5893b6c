import { makeBenchWorkbook } from './make-workbook';

const [path, rows] = process.argv.slice(2);
await makeBenchWorkbook(path, rows ? Number(rows) : 200_000);
