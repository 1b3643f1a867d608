/**
 * The validation report of one import: errors (each with file, physical line, column and value),
 * capped at a readable number with the total kept, and warnings grouped by kind with a count and a
 * few examples.
 */
export interface ImportProblem {
  line: number | null;
  column: string | null;
  value: string | null;
  message: string;
}

export const MAX_ERRORS = 50;
const MAX_EXAMPLES = 5;

export class Report {
  readonly errors: ImportProblem[] = [];
  errorCount = 0;
  private readonly warningGroups = new Map<
    string,
    { count: number; examples: string[]; text: (n: number, ex: string) => string }
  >();

  constructor(readonly fileName: string) {}

  /** Record an error; `message` says what is wrong and what to do. */
  error(line: number | null, column: string | null, value: string | null, message: string): void {
    this.errorCount++;
    if (this.errors.length >= MAX_ERRORS) return;
    const where = [line !== null ? `line ${line}` : null, column !== null ? `column '${column}'` : null]
      .filter(Boolean)
      .join(', ');
    const what = value !== null && !message.includes(`'${value}'`) ? `'${value}' ${message}` : message;
    this.errors.push({
      line,
      column,
      value,
      message: `${this.fileName}${where ? ` ${where}` : ''}: ${what}`,
    });
  }

  /** Count a warning of one kind; `text(count, examples)` renders it once at the end. */
  warn(key: string, example: string | null, text: (count: number, examples: string) => string): void {
    let g = this.warningGroups.get(key);
    if (!g) this.warningGroups.set(key, (g = { count: 0, examples: [], text }));
    g.count++;
    if (example !== null && g.examples.length < MAX_EXAMPLES) g.examples.push(example);
  }

  get hasErrors(): boolean {
    return this.errorCount > 0;
  }

  /** The errors, with a closing entry giving the total when some were left out. */
  errorList(): ImportProblem[] {
    if (this.errorCount <= this.errors.length) return [...this.errors];
    return [
      ...this.errors,
      {
        line: null,
        column: null,
        value: null,
        message: `${this.fileName}: … and ${this.errorCount - this.errors.length} more errors (${this.errorCount} in total); nothing was written`,
      },
    ];
  }

  warningList(): string[] {
    return [...this.warningGroups.values()].map((g) => {
      const more = g.count > g.examples.length && g.examples.length > 0 ? ', …' : '';
      return g.text(g.count, g.examples.length ? `${g.examples.join(', ')}${more}` : '');
    });
  }
}
