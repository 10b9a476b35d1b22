/**
 * CSV text, as RFC 4180 writes it: commas between cells, double quotes around cells holding commas,
 * quotes or line breaks, "" for a quote inside. Numbers in JavaScript's shortest round-trip form.
 */

const needsQuotes = /[",\r\n]|^\s|\s$/;
export function csvCell(value: string): string {
  return needsQuotes.test(value) ? `"${value.replace(/"/g, '""')}"` : value;
}

/** Shortest text that reads back as the same number, −0 included. */
export function numberText(n: number | undefined): string {
  if (n === undefined) return '';
  return Object.is(n, -0) ? '-0' : String(n);
}

export type RawRecord = { row: number; cells: string[] };

/**
 * RFC 4180 records: commas between cells, double quotes around cells holding commas, quotes or line
 * breaks, "" for a quote inside. A record's row is the file line it starts on. Blank lines are skipped.
 */
export function readCsv(text: string): { records: RawRecord[]; error?: { row: number; message: string } } {
  const records: RawRecord[] = [];
  let cells: string[] = [];
  let cell = '';
  let quoted = false;
  let cellStarted = false;
  let line = 1;
  let recordLine = 1;
  let i = 0;
  const endCell = () => {
    cells.push(cell);
    cell = '';
    cellStarted = false;
  };
  const endRecord = () => {
    endCell();
    if (!(cells.length === 1 && cells[0].trim() === '')) records.push({ row: recordLine, cells });
    cells = [];
  };
  while (i < text.length) {
    const c = text[i];
    if (quoted) {
      if (c === '"') {
        if (text[i + 1] === '"') {
          cell += '"';
          i += 2;
          continue;
        }
        quoted = false;
        i++;
        continue;
      }
      if (c === '\n') line++;
      cell += c;
      i++;
      continue;
    }
    if (c === '"') {
      if (cellStarted && cell.trim() !== '')
        return {
          records,
          error: { row: line, message: 'A quote inside an unquoted cell: quote the whole cell' },
        };
      cell = '';
      quoted = true;
      cellStarted = true;
      i++;
      continue;
    }
    if (c === ',') {
      endCell();
      i++;
      continue;
    }
    if (c === '\r' || c === '\n') {
      endRecord();
      i += c === '\r' && text[i + 1] === '\n' ? 2 : 1;
      line++;
      recordLine = line;
      continue;
    }
    cell += c;
    cellStarted = true;
    i++;
  }
  if (quoted) return { records, error: { row: recordLine, message: 'A quoted cell is never closed' } };
  if (cellStarted || cells.length > 0) endRecord();
  return { records };
}
