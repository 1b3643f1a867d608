/**
 * Reading numbers as exports write them: an optional sign, digits with thousands separators
 * (',' '.' ' ' or a non-breaking/thin space, or "'" as in Swiss exports) and a decimal mark that is
 * '.' or ',' for the whole file. Groups after the first must have exactly three digits, so "1,5" in
 * a file with decimal point is refused rather than read as 15.
 */
export type DecimalMark = '.' | ',';

const PLAIN = /^[-+]?\d+(\.\d+)?$/;

/** The number in `text` (already trimmed), or a string saying why it is not one. */
export function parseNumber(text: string, decimal: DecimalMark): number | string {
  if (PLAIN.test(text) && (decimal === '.' || !text.includes('.'))) return Number(text);
  let s = text.replace(/[\u00a0\u2009\u202f ']/g, '_');
  let sign = '';
  if (s.startsWith('-') || s.startsWith('+')) {
    sign = s[0] === '-' ? '-' : '';
    s = s.slice(1);
  } else if (s.endsWith('-')) {
    // trailing minus, as some ledgers print returns
    sign = '-';
    s = s.slice(0, -1);
  } else if (/^\(.*\)$/.test(s)) {
    sign = '-';
    s = s.slice(1, -1);
  }
  const thousands = decimal === '.' ? ',' : '.';
  const parts = s.split(decimal);
  if (parts.length > 2) return `has more than one decimal mark '${decimal}'`;
  const [intPart, frac] = parts;
  if (frac !== undefined && !/^\d+$/.test(frac)) return 'is not a number';
  const groups = intPart.split(new RegExp(`[_${thousands === '.' ? '\\.' : ','}]`));
  if (groups.length > 1) {
    if (!/^\d{1,3}$/.test(groups[0]) || groups.slice(1).some((g) => !/^\d{3}$/.test(g))) {
      if (decimal === ',' && intPart.includes('.') && frac === undefined && groups.length === 2) {
        return "is not a number (a decimal point? this file is read with decimal comma ','; pass --decimal dot)";
      }
      if (decimal === '.' && intPart.includes(',') && frac === undefined && groups.length === 2) {
        return "is not a number (a decimal comma? this file is read with decimal point '.'; pass --decimal comma)";
      }
      return 'is not a number (badly placed thousands separator)';
    }
  } else if (!/^\d+$/.test(groups[0])) {
    if (decimal === ',' && /^\d+\.\d+$/.test(intPart)) {
      return "is not a number (a decimal point? this file is read with decimal comma ','; pass --decimal dot)";
    }
    return 'is not a number';
  }
  const value = Number(`${sign}${groups.join('')}${frac !== undefined ? `.${frac}` : ''}`);
  return Number.isFinite(value) ? value : 'is not a number';
}

/** Yes/no cells: 1/0, yes/no, y/n, true/false, x/empty (case-insensitive). */
export function parseFlag(text: string): boolean | null {
  switch (text.toLowerCase()) {
    case '1':
    case 'yes':
    case 'y':
    case 'true':
    case 'x':
      return true;
    case '0':
    case 'no':
    case 'n':
    case 'false':
    case '':
      return false;
    default:
      return null;
  }
}
