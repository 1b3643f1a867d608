/**
 * One file of the `fit` command: read the weekly series, choose or fit the model, and return its
 * JSON line, or the input error (with file, line and field) when the file cannot be read.
 */
import { choiceRecord } from '../../core/select/choiceRecord';
import type { FitCommandOptions } from './fit';
import { CsvInputError, readWeeklyCsv } from './fit-csv';

export type FitFileOutcome = { line: string } | { error: string };

export function fitFile(input: { file: string; options: FitCommandOptions }): FitFileOutcome {
  const { file, options } = input;
  try {
    const series = readWeeklyCsv(file, options);
    // Model choice (automatic without --order), forecast, diagnosis and flags: core/select.
    return { line: JSON.stringify(choiceRecord(file, series.values, series.firstWeek, options)) };
  } catch (err) {
    if (err instanceof CsvInputError) return { error: err.message };
    throw err;
  }
}
