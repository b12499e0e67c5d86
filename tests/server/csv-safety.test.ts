import { describe, expect, it } from 'vitest';
import { decodeCsvUpload } from '../../server/csv';
import { HttpError } from '../../server/errors';

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
    expect(decodeCsvUpload(Buffer.from('name\nDégazeur\n', 'utf8'), 'a.csv')).toBe(
      'name\nDégazeur\n',
    );
    expect(
      decodeCsvUpload(
        Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from('name\nA\n')]),
        'a.csv',
      ),
    ).toBe('name\nA\n');
  });

  it('names the file and the encoding it found', () => {
    const utf16le = Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from('name\nA\n', 'utf16le')]);
    expect(reason(utf16le)).toMatch(/line-list\.csv.*UTF-16/);
    const utf16be = Buffer.from([0xfe, 0xff, 0x00, 0x6e, 0x00, 0x61]);
    expect(reason(utf16be)).toMatch(/line-list\.csv.*UTF-16/);
    expect(reason(Buffer.from('name\nA\n', 'utf16le'), 'no-bom.csv')).toMatch(
      /no-bom\.csv.*UTF-16/,
    );
    const latin1 = Buffer.from('name,line\nDégazeur,L1\n', 'latin1');
    expect(reason(latin1, 'materials.csv')).toMatch(/materials\.csv is not UTF-8.*line 2/);
  });
});
