/**
 * Deciding the day/month order of a file whose dates are not ISO: a scan of the date column alone.
 * A number above 12 in first place proves day/month/year, in second place month/day/year. A file
 * that proves both, or neither while holding dates such as 03/04/2026, is refused with a request
 * to choose (`--date-order dmy|mdy`).
 */
import { type DateOrder, pairEvidence, readDate } from './dates';

export class DateOrderEvidence {
  dmyLine: { line: number; text: string } | null = null;
  mdyLine: { line: number; text: string } | null = null;
  ambiguous: { line: number; text: string } | null = null;

  see(text: string, line: number): void {
    const d = readDate(text);
    if (d.kind !== 'pair') return;
    const e = pairEvidence(d);
    if (e === 'dmy' && !this.dmyLine) this.dmyLine = { line, text };
    else if (e === 'mdy' && !this.mdyLine) this.mdyLine = { line, text };
    else if (e === 'both' && d.a !== d.b && !this.ambiguous) this.ambiguous = { line, text };
  }

  /** The order, or a message asking the user to choose. */
  decide(): { order: DateOrder } | { problem: string; line: number; value: string } {
    if (this.dmyLine && this.mdyLine) {
      return {
        problem: `the dates mix orders: '${this.dmyLine.text}' (line ${this.dmyLine.line}) can only be day/month/year, '${this.mdyLine.text}' (line ${this.mdyLine.line}) only month/day/year; fix the file`,
        line: this.mdyLine.line,
        value: this.mdyLine.text,
      };
    }
    if (this.dmyLine) return { order: 'dmy' };
    if (this.mdyLine) return { order: 'mdy' };
    if (this.ambiguous) {
      return {
        problem: `dates such as '${this.ambiguous.text}' can be read as day/month/year or month/day/year and the file does not tell which; say which with --date-order dmy or --date-order mdy`,
        line: this.ambiguous.line,
        value: this.ambiguous.text,
      };
    }
    return { order: 'dmy' };
  }
}
