import type { RequestHandler } from 'express';
import multer from 'multer';
import Papa from 'papaparse';
import { HttpError } from './errors';
import { findTextProblem } from '../shared/model/fields';

/** Largest CSV upload accepted. */
export const CSV_LIMIT_BYTES = 1024 * 1024;

const upload = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: CSV_LIMIT_BYTES, files: 1, fields: 10 },
}).single('file');

/**
 * Accept a CSV as a multipart upload (field `file`) or as a raw `text/csv` body; the text
 * lands in res.locals.csv. Other multipart fields stay in req.body.
 */
export const receiveCsv: RequestHandler = (req, res, next) => {
  const type = req.headers['content-type'] ?? '';
  if (type.startsWith('multipart/form-data')) {
    upload(req, res, (err: unknown) => {
      if (err) {
        const code = (err as { code?: string }).code;
        next(
          code === 'LIMIT_FILE_SIZE'
            ? new HttpError(413, 'payload_too_large', 'The CSV file is larger than 1 MB')
            : new HttpError(400, 'bad_request', 'The upload could not be read'),
        );
        return;
      }
      if (!req.file) {
        next(
          new HttpError(422, 'validation', 'Attach the CSV as the "file" field', [
            { path: 'file', message: 'is required' },
          ]),
        );
        return;
      }
      try {
        res.locals.csv = decodeCsvUpload(
          req.file.buffer,
          req.file.originalname || 'the uploaded file',
        );
      } catch (e) {
        next(e);
        return;
      }
      next();
    });
    return;
  }
  if (type.startsWith('text/csv') || type.startsWith('text/plain')) {
    const chunks: Buffer[] = [];
    let size = 0;
    req.on('data', (c: Buffer) => {
      size += c.length;
      if (size <= CSV_LIMIT_BYTES) chunks.push(c);
    });
    req.on('end', () => {
      if (size > CSV_LIMIT_BYTES) {
        next(new HttpError(413, 'payload_too_large', 'The CSV file is larger than 1 MB'));
        return;
      }
      try {
        res.locals.csv = decodeCsvUpload(Buffer.concat(chunks), 'The CSV body');
      } catch (e) {
        next(e);
        return;
      }
      next();
    });
    req.on('error', next);
    return;
  }
  next(
    new HttpError(
      415,
      'bad_request',
      'Send the CSV as multipart/form-data (field "file") or as text/csv',
    ),
  );
};

const notUtf8 = (name: string, message: string) =>
  new HttpError(
    422,
    'validation',
    `${name} ${message}; save it as "CSV UTF-8" and upload it again`,
    [{ path: 'file', message }],
  );

/**
 * The text of an uploaded CSV, which must be UTF-8 (a UTF-8 byte-order mark is dropped). UTF-16
 * (by its byte-order mark or its NUL bytes) and other 8-bit encodings such as Latin-1 or
 * Windows-1252 are refused with a 422 that names the file and, for the latter, the line.
 */
export function decodeCsvUpload(buf: Buffer, name: string): string {
  if (
    buf.length >= 2 &&
    ((buf[0] === 0xff && buf[1] === 0xfe) || (buf[0] === 0xfe && buf[1] === 0xff))
  ) {
    throw notUtf8(
      name,
      `is UTF-16 text (byte-order mark ${buf[0] === 0xff ? 'FF FE' : 'FE FF'}), not UTF-8`,
    );
  }
  const start = buf.length >= 3 && buf[0] === 0xef && buf[1] === 0xbb && buf[2] === 0xbf ? 3 : 0;
  const body = buf.subarray(start);
  const sample = body.subarray(0, 4096);
  let nuls = 0;
  for (const b of sample) if (b === 0) nuls++;
  if (sample.length > 0 && nuls * 4 >= sample.length)
    throw notUtf8(name, 'looks like UTF-16 text (every other byte is zero), not UTF-8');
  try {
    return new TextDecoder('utf-8', { fatal: true }).decode(body);
  } catch {
    const bad = firstInvalidUtf8(body);
    let line = 1;
    for (let i = 0; i < bad; i++) if (body[i] === 0x0a) line++;
    throw notUtf8(
      name,
      `is not UTF-8 (for example Latin-1 or Windows-1252): the first byte that is not UTF-8 is on line ${line}`,
    );
  }
}

/** Offset of the first byte that does not start or continue a well-formed UTF-8 sequence. */
function firstInvalidUtf8(b: Uint8Array): number {
  for (let i = 0; i < b.length; ) {
    const c = b[i]!;
    const n =
      c < 0x80
        ? 0
        : c >= 0xc2 && c <= 0xdf
          ? 1
          : c >= 0xe0 && c <= 0xef
            ? 2
            : c >= 0xf0 && c <= 0xf4
              ? 3
              : -1;
    if (n < 0) return i;
    for (let k = 1; k <= n; k++) if (i + k >= b.length || (b[i + k]! & 0xc0) !== 0x80) return i;
    i += n + 1;
  }
  return b.length;
}

export interface CsvRow {
  /** Line number in the file (the header is line 1). */
  line: number;
  values: Record<string, string>;
}

/** Parse CSV text with a header row; header names are trimmed and lower-cased. */
export function parseCsv(text: string): {
  headers: string[];
  rows: CsvRow[];
  errors: { line: number; message: string }[];
} {
  const out = Papa.parse<Record<string, string>>(text.replace(/^\uFEFF/, ''), {
    header: true,
    skipEmptyLines: 'greedy',
    transformHeader: (h) => h.trim().toLowerCase(),
    transform: (v) => v.trim(),
  });
  const headers = out.meta.fields ?? [];
  // With header: true, data row i sits on file line i + 2 (ignoring quoted newlines).
  const rows = out.data.map((values, i) => ({ line: i + 2, values }));
  const errors = out.errors.map((e) => ({ line: (e.row ?? 0) + 2, message: e.message }));
  // Text PostgreSQL cannot store (U+0000) is refused here, with its line and column.
  for (const h of headers) {
    const problem = findTextProblem(h);
    if (problem) errors.push({ line: 1, message: `a column name ${problem}` });
  }
  for (const row of rows) {
    for (const [h, v] of Object.entries(row.values)) {
      const problem = typeof v === 'string' ? findTextProblem(v) : undefined;
      if (problem)
        errors.push({
          line: row.line,
          message: `column "${findTextProblem(h) ? '?' : h}" ${problem}`,
        });
    }
  }
  return { headers, rows, errors };
}

/**
 * Data rows of a CSV with a header, counted only as far as `cap + 1`: a cheap newline count
 * first; when that is over the cap, only a prefix of the text is parsed (quoted newlines make
 * rows span lines, so the prefix grows until it holds cap + 1 rows or is the whole text).
 */
export function countCsvRows(text: string, cap: number): number {
  const endOfLine = (n: number) => {
    let at = -1;
    for (let k = 0; k < n; k++) {
      at = text.indexOf('\n', at + 1);
      if (at === -1) return text.length;
    }
    return at;
  };
  let newlines = 0;
  for (let i = text.indexOf('\n'); i !== -1 && newlines <= cap + 1; i = text.indexOf('\n', i + 1))
    newlines++;
  // Data rows are at most the newlines (header, then one per row; the last may lack its own).
  if (newlines <= cap) return newlines;
  let lines = cap + 2;
  for (;;) {
    const end = endOfLine(lines);
    const prefix = text.slice(0, end).replace(/^\uFEFF/, '');
    const rows = Math.max(
      0,
      Papa.parse<string[]>(prefix, { skipEmptyLines: 'greedy' }).data.length - 1,
    );
    if (rows > cap || end >= text.length) return Math.min(rows, cap + 1);
    lines *= 2;
  }
}
