// What was done to a file on the way in, as sentences for the upload result and the build
// page: lines left out after the table, text skipped inside it, thousands separators, how the
// conditions were read, sign flips, missing HFR readings.
import type { ParsedTable } from './types';

/**
 * Parsed table + the notes of applyMapping → the import notes, in reading order.
 * Cost: O(columns + notes).
 * @example importNotes(table, curve.notes) // ['lines 18–22 after the table were left out …']
 */
export function importNotes(table: ParsedTable, appliedNotes: readonly string[] = []): string[] {
  const notes: string[] = [];
  if (table.decimalMarkAmbiguous === true) {
    notes.push('the decimal mark could not be told from a thousands separator (every number looks like "1,500"): commas read as decimal commas');
  }
  const grouped = table.groupedCells ?? [];
  for (let column = 0; column < grouped.length; column++) {
    const count = grouped[column];
    if (count > 0) {
      const example = table.decimalComma ? '"1.250,5" = 1250.5' : '"1,250.5" = 1250.5';
      notes.push(`column "${table.header[column]}": ${count} number${count === 1 ? '' : 's'} written with thousands separators, read as such (${example})`);
    }
  }
  const after = table.afterTable;
  if (after != null) {
    const span = after.firstLine === after.lastLine ? `line ${after.firstLine}` : `lines ${after.firstLine}–${after.lastLine}`;
    const first = after.samples.length > 0 ? `, starting "${after.samples[0]}"` : '';
    notes.push(`the table ends at line ${lastDataLine(table)}: ${span} below it (${after.lineCount} line${after.lineCount === 1 ? '' : 's'}${first}) were left out`);
  }
  const skipped = table.skippedLines;
  if (skipped != null && skipped.count > 0) {
    const lines = skipped.lines.slice(0, 5).join(', ') + (skipped.count > 5 ? ` and ${skipped.count - 5} more` : '');
    const sample = skipped.samples.length > 0 ? ` ("${skipped.samples[0]}")` : '';
    notes.push(`${skipped.count} text line${skipped.count === 1 ? '' : 's'} inside the data skipped (line${skipped.count === 1 ? '' : 's'} ${lines})${sample}`);
  }
  for (const note of table.conditions.notes ?? []) notes.push(note);
  for (const note of appliedNotes) notes.push(note);
  return notes;
}

function lastDataLine(table: ParsedTable): number {
  return table.dataLines.length > 0 ? table.dataLines[table.dataLines.length - 1] : table.headerLine;
}
