// Refused files: a code from PRODUCT.md and a message that says what is
// wrong, where (the 1-based file line when there is one) and what to do.

import type { LayoutProblem } from './layout';
import { MAX_COLUMNS, MAX_LINE_LENGTH, MAX_ROWS, type LimitProblem } from './limits';
import type { RefusalCode, RideRefusal } from './types';

const TIME_WORDS = 'time, elapsed, t, seconds or timestamp';
const MEASUREMENT_WORDS = 'power, cadence, distance, a channel current, pulse width, frequency or heart rate';

export function refuse(code: RefusalCode, message: string, line?: number): RideRefusal {
  return { ok: false, error: line === undefined ? { code, message } : { code, message, line } };
}

const megabytes = (bytes: number) => `${(bytes / (1024 * 1024)).toFixed(1)} MB`;

export const refusals = {
  tooLarge: (size: number, limit: number) =>
    refuse(
      'too_large',
      `The file is ${megabytes(size)}, more than the ${megabytes(limit)} a ride file may have. Check that it is the CSV export of one ride.`,
    ),
  empty: () => refuse('empty_file', 'The file is empty. Export the ride from the cycle again and upload the new file.'),
  notText: () =>
    refuse('not_text', 'The file holds binary data, not text, so it is not a CSV ride file. Export the ride as CSV and upload that file.'),
  noDataRows: (headerLine: number, anyRow: boolean) =>
    refuse(
      'no_data_rows',
      anyRow
        ? `The header row is on line ${headerLine}, but no row after it has a readable time. Check that the export holds the ride's samples and that the time column has values.`
        : `The header row on line ${headerLine} is not followed by any data rows. Check that the export holds the ride's samples.`,
      headerLine,
    ),
  noValues: (headerLine: number) =>
    refuse(
      'no_measurements',
      `The measurement columns of the header row on line ${headerLine} hold no usable values: every one is empty, not a number or outside physical limits. Check the export settings of the cycle.`,
      headerLine,
    ),
  fromLimit: (p: LimitProblem): RideRefusal => {
    switch (p.code) {
      case 'line_too_long':
        return refuse(
          'line_too_long',
          `Line ${p.line} has ${p.length.toLocaleString('en')} characters; a ride file's lines have at most ${MAX_LINE_LENGTH.toLocaleString('en')}. Check that this is the CSV export of one ride, with one sample per line.`,
          p.line,
        );
      case 'too_many_columns':
        return refuse(
          'too_many_columns',
          `Line ${p.line} has more than ${MAX_COLUMNS} columns, more than a ride file has. Check that this is the CSV export of one ride.`,
          p.line,
        );
      case 'too_many_rows':
        return refuse(
          'too_many_rows',
          `The file has more than ${MAX_ROWS.toLocaleString('en')} lines after its header row (line ${p.line} is one too many), more than one ride holds even at 10 samples a second for 13 hours. Check that it is the export of a single ride.`,
          p.line,
        );
    }
  },
  fromLayout: (p: LayoutProblem | LimitProblem): RideRefusal => {
    switch (p.code) {
      case 'line_too_long':
      case 'too_many_columns':
      case 'too_many_rows':
        return refusals.fromLimit(p);
      case 'no_header':
        return refuse(
          'no_header',
          `No header row was found in the first ${p.searched} lines: no line names a time column (${TIME_WORDS}) together with a measurement (${MEASUREMENT_WORDS}). Check that this is a ride file exported as CSV with its header row, or ask the clinic admin for an import profile for this device.`,
        );
      case 'no_time_column':
        return refuse(
          'no_time_column',
          `Line ${p.line} names measurement columns (${p.headers.join(', ')}) but no time column. The file needs a column named ${TIME_WORDS}; if the device names it otherwise, map it in an import profile.`,
          p.line,
        );
      case 'no_measurements':
        return refuse(
          'no_measurements',
          `Line ${p.line} names a time column (${p.headers.join(', ')}) but no measurement column (${MEASUREMENT_WORDS}). Check the export settings of the cycle, or map its columns in an import profile.`,
          p.line,
        );
    }
  },
};
