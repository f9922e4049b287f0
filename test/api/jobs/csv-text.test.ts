import { describe, expect, it } from 'vitest';
import { csvText } from '../../../api/jobs/csv-text.js';

describe('csvText', () => {
  it('csvText(table) writes a header line and CRLF-ended records, quoting as RFC 4180 §2 says', () => {
    // ref: RFC 4180 (2005), §2 rules 1, 3, 6 and 7: CRLF line breaks, an optional header
    // line, fields with commas, quotes or line breaks in double quotes, quotes doubled.
    const text = csvText({
      columns: ['name', 'valueV', 'note'],
      rows: [
        ['plain', 1.5, null],
        ['with, comma', -0.000125, 'say "hi"'],
        ['line\nbreak', 1e21, true],
      ],
    });
    expect(text).toBe(
      'name,valueV,note\r\nplain,1.5,\r\n"with, comma",-0.000125,"say ""hi"""\r\n"line\nbreak",1e+21,true\r\n',
    );
  });

  it('csvText throws RangeError for a short row or a non-finite number', () => {
    expect(() => csvText({ columns: ['a', 'b'], rows: [[1]] })).toThrow(RangeError);
    expect(() => csvText({ columns: ['a'], rows: [[Number.NaN]] })).toThrow(RangeError);
  });
});
