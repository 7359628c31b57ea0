/**
 * Splits one CSV line on `delimiter`, honouring double quotes (`"a;b"` is one field, `""` inside
 * quotes is a quote). Used by the sniffer on the head of a file; the bulk of a file goes through
 * papaparse.
 */
export function splitCsvLine(line: string, delimiter: string): string[] {
  if (delimiter.length !== 1) throw new Error('splitCsvLine: delimiter must be one character');
  if (!line.includes('"')) return line.split(delimiter);
  const fields: string[] = [];
  let field = '';
  let isQuoted = false;
  for (let i = 0; i < line.length; i++) {
    const ch = line[i];
    if (isQuoted) {
      if (ch !== '"') field += ch;
      else if (line[i + 1] === '"') {
        field += '"';
        i++;
      } else isQuoted = false;
    } else if (ch === '"') isQuoted = true;
    else if (ch === delimiter) {
      fields.push(field);
      field = '';
    } else field += ch;
  }
  fields.push(field);
  return fields;
}

/** Splits text into lines on `\r\n`, `\n` or `\r`; line i is row i of the file. */
export function splitLines(text: string): string[] {
  return text.split(/\r\n|\n|\r/);
}
