import type { Query } from './db';

// Searching and ordering lists by name, the same in every list (triage, the
// caseload, the client list): every word of the search within the name, in
// any case; names in Unicode's root order (collation kinloop_names, made by a
// migration).

/** The words of a search box: split on spaces, empty when blank. */
export const searchWords = (text: string) => text.trim().split(/\s+/).filter(Boolean);

const like = (word: string) => `%${word.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;

/** Keeps the rows whose `column` holds every word (ILIKE, with %, _ and \ taken literally). */
export function whereNameHasWords(q: Query, column: string, text: string): Query {
  for (const word of searchWords(text)) q.whereILike(column, like(word));
  return q;
}

/** `ORDER BY` by name (then id, so pages never overlap); `desc` reverses both. */
export const byNameSql = (column: string, idColumn: string, desc = false) => {
  const dir = desc ? 'DESC' : 'ASC';
  return `${column} COLLATE kinloop_names ${dir}, ${idColumn} ${dir}`;
};
