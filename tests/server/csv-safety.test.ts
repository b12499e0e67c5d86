import { describe, expect, it } from 'vitest';
import { neutraliseCsvCell, neutraliseCsvRows, toSafeCsv } from '../../shared/csv/safe-cells';
import { decodeCsvUpload } from '../../server/csv';
import { HttpError } from '../../server/errors';

describe('exported CSV cells (shared/csv)', () => {
  it('prefixes cells that a spreadsheet would run as a formula', () => {
    for (const v of ['=1+1', '+SUM(A1)', '-2+3', '@cmd', '\t=x', '\r=x', '=HYPERLINK("http://x","y")']) expect(neutraliseCsvCell(v)).toBe(`'${v}`);
    for (const v of ['A106-B', '4"-PG-1001', 'plain', '', '-20', '+1.5e3', '-.5']) expect(neutraliseCsvCell(v)).toBe(v);
    expect(neutraliseCsvCell(-20)).toBe(-20);
    expect(neutraliseCsvCell(null)).toBe(null);
  });

  it('neutralises rows and whole files, headers included', () => {
    expect(neutraliseCsvRows([['=a', 1], ['b', '@c']])).toEqual([["'=a", 1], ['b', "'@c"]]);
    expect(neutraliseCsvRows([{ name: '=cmd|x', n: 3 }])).toEqual([{ name: "'=cmd|x", n: 3 }]);
    const csv = toSafeCsv([{ id: 'S1', note: '=2+5' }, { id: '-B2', note: 'ok' }]);
    expect(csv).toBe("id,note\r\nS1,'=2+5\r\n'-B2,ok");
    expect(toSafeCsv([['=x', 2]], { header: ['@h', 'n'] })).toBe("'@h,n\r\n'=x,2");
  });
});

describe('CSV uploads that are not UTF-8', () => {
  const reason = (buf: Buffer, name = 'line-list.csv') => {
    try {
      decodeCsvUpload(buf, name);
      return 'accepted';
    } catch (e) {
      expect(e).toBeInstanceOf(HttpError);
      const h = e as HttpError;
      expect(h.status).toBe(422);
      return h.message;
    }
  };

  it('reads UTF-8 with or without a byte-order mark', () => {
    expect(decodeCsvUpload(Buffer.from('name\nDégazeur\n', 'utf8'), 'a.csv')).toBe('name\nDégazeur\n');
    expect(decodeCsvUpload(Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from('name\nA\n')]), 'a.csv')).toBe('name\nA\n');
  });

  it('names the file and the encoding it found', () => {
    const utf16le = Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from('name\nA\n', 'utf16le')]);
    expect(reason(utf16le)).toMatch(/line-list\.csv.*UTF-16/);
    const utf16be = Buffer.from([0xfe, 0xff, 0x00, 0x6e, 0x00, 0x61]);
    expect(reason(utf16be)).toMatch(/line-list\.csv.*UTF-16/);
    expect(reason(Buffer.from('name\nA\n', 'utf16le'), 'no-bom.csv')).toMatch(/no-bom\.csv.*UTF-16/);
    const latin1 = Buffer.from('name,line\nDégazeur,L1\n', 'latin1');
    expect(reason(latin1, 'materials.csv')).toMatch(/materials\.csv is not UTF-8.*line 2/);
  });
});
