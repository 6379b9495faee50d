/**
 * Which decimal mark a block of numbers uses, from all of its cells at once — the one rule for pasted values
 * and for CSV files. Each cell is evidence:
 * - `12,5`, `0,213`, `1,2345` can only be a decimal comma; `12.5`, `0.213` only a decimal point;
 * - `1.234,5` and `1,234.5`: the last separator is the decimal mark;
 * - `1,234,567` (two groups) can only be grouping, so the mark is the other one; likewise `1.234.567`;
 * - `1,234` and `1.234` (one group of three digits after a non-zero lead) could be either.
 * A block with evidence for one mark only takes it. With no evidence the person's locale decides: cells like
 * `24,995` in a decimal-comma locale read as decimals, as that person means them; but where the locale would
 * read such a cell as thousands (`1,234` in a decimal-point locale, the pasted-from-another-country case) the
 * person must be asked (`ambiguous`). With evidence for both marks, the person is asked as well.
 */
export interface DecimalMarkReading {
  mark: '.' | ',';
  /** True when the cells do not settle the mark: ask the person before reading the values. */
  ambiguous: boolean;
  /** A cell that shows the question ("1,234"). */
  example?: string;
}

const GROUPING = /[\s\u00a0\u202f']/g;
const SIGNED = /^[-+\u2212]?/;

type Evidence = '.' | ',' | 'ambiguous' | undefined;

function evidenceOf(cell: string): Evidence {
  const s = cell
    .trim()
    .replace(GROUPING, '')
    .replace(SIGNED, '')
    .replace(/e[-+]?\d+$/i, '');
  if (!/^[\d.,]+$/.test(s) || !/\d/.test(s)) return undefined;
  const dot = s.lastIndexOf('.');
  const comma = s.lastIndexOf(',');
  if (dot >= 0 && comma >= 0) return dot > comma ? '.' : ',';
  const sep = dot >= 0 ? '.' : comma >= 0 ? ',' : undefined;
  if (!sep) return undefined;
  const other = sep === '.' ? ',' : '.';
  const parts = s.split(sep);
  if (parts.length > 2) return parts.slice(1).every((p) => p.length === 3) ? other : undefined;
  const [lead, tail] = parts as [string, string];
  if (tail.length === 3 && /^[1-9]\d{0,2}$/.test(lead)) return 'ambiguous';
  return sep;
}

export function inferDecimalMark(cells: Iterable<string>, fallback: '.' | ','): DecimalMarkReading {
  let point = 0;
  let comma = 0;
  let example: string | undefined;
  for (const cell of cells) {
    const e = evidenceOf(cell);
    if (e === '.') point++;
    else if (e === ',') comma++;
    // Ambiguous only where the locale would read the separator as grouping.
    else if (e === 'ambiguous' && !cell.includes(fallback)) example ??= cell.trim();
  }
  if (point > 0 && comma > 0) {
    return { mark: point >= comma ? '.' : ',', ambiguous: true, example: example ?? 'the values' };
  }
  if (point > 0) return { mark: '.', ambiguous: false };
  if (comma > 0) return { mark: ',', ambiguous: false };
  return { mark: fallback, ambiguous: example !== undefined, ...(example ? { example } : {}) };
}
