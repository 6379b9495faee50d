/**
 * A number to a fixed number of decimals as `Intl.NumberFormat('en-US', { minimumFractionDigits: d,
 * maximumFractionDigits: d, useGrouping })` writes it — the same text, worked out from the number's digits
 * instead of through Intl, which costs about a microsecond a call: writing the CSV of a 20 000-process portfolio
 * (some 300 000 figures) spent nearly half its time there, and the command line's table a few per cent of `rank`.
 *
 * Intl rounds the number's shortest decimal form (the digits `String(v)` gives), half away from zero, not its
 * binary value as `toFixed` does: 1.005 is "1.01" here and in Intl, "1.00" from `toFixed`. A negative number
 * keeps its sign when it rounds to zero, and so does −0 ("-0.00"), as Intl writes them. Finite numbers only;
 * the spec compares it with Intl over random numbers, ties and magnitudes.
 */
export function fixedDecimalText(v: number, decimals: number, grouping: boolean): string {
  const negative = v < 0 || Object.is(v, -0);
  // The shortest decimal form: digits, and where the point falls in them (an exponent moves it).
  const shortest = String(negative ? -v : v);
  const e = shortest.indexOf('e');
  const mantissa = e < 0 ? shortest : shortest.slice(0, e);
  const dot = mantissa.indexOf('.');
  const digits = dot < 0 ? mantissa : mantissa.slice(0, dot) + mantissa.slice(dot + 1);
  const point = (dot < 0 ? mantissa.length : dot) + (e < 0 ? 0 : Number(shortest.slice(e + 1)));
  // The number × 10^decimals, rounded: its digits up to the last kept place, plus one at that place when the
  // first digit dropped is 5 or more (half away from zero, the sign being apart).
  const kept = point + decimals;
  let whole: string;
  if (kept >= digits.length) whole = digits + '0'.repeat(kept - digits.length);
  else if (kept < 0) whole = '0';
  else {
    whole = kept === 0 ? '0' : digits.slice(0, kept);
    if (digits.charCodeAt(kept) >= 53) whole = plusOne(whole);
  }
  let start = 0;
  while (start < whole.length - 1 && whole.charCodeAt(start) === 48) start += 1;
  if (start > 0) whole = whole.slice(start);
  if (whole.length <= decimals) whole = '0'.repeat(decimals + 1 - whole.length) + whole;
  const integer = whole.slice(0, whole.length - decimals);
  const text =
    (grouping ? grouped(integer) : integer) +
    (decimals > 0 ? '.' + whole.slice(whole.length - decimals) : '');
  return negative ? '-' + text : text;
}

/** A string of decimal digits plus one (999 → 1000). */
function plusOne(digits: string): string {
  let i = digits.length - 1;
  while (i >= 0 && digits.charCodeAt(i) === 57) i -= 1;
  if (i < 0) return '1' + '0'.repeat(digits.length);
  return (
    digits.slice(0, i) + String.fromCharCode(digits.charCodeAt(i) + 1) + '0'.repeat(digits.length - 1 - i)
  );
}

/** Digits of a whole number with a comma every three from the right, as en-US groups them. */
function grouped(integer: string): string {
  if (integer.length <= 3) return integer;
  let out = integer.slice(0, ((integer.length - 1) % 3) + 1);
  for (let i = out.length; i < integer.length; i += 3) out += ',' + integer.slice(i, i + 3);
  return out;
}
