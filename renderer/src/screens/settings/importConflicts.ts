/** A question a merging import found changed, in a line for people (docs/api.md, "Importing"). */
import type { ImportConflict } from '../../../../shared/contract';

/** Where the question is in its file, as people count (the first is question 1), what it is called, and what differs. */
export function conflictLine(c: ImportConflict): string {
  const place = c.row === null ? `Question ${c.index + 1}` : `The question on row ${c.row}`;
  return `${place}, “${c.title}” (${c.id}): differs in ${c.differs.join(', ')}`;
}
