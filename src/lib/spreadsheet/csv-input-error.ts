/**
 * A problem in a CSV file, with the line (1-based, as an editor shows it) and column it was found in. A module
 * of its own so that the command line can recognise it without loading the CSV reader (and Papa Parse).
 */
export class CsvInputError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'CsvInputError';
  }
}
