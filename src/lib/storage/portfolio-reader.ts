import { CapstanDatabase } from './database';
import { loadPortfolioRecords } from './portfolio-overview';

/**
 * Read-only access to the portfolio for a background worker: the worker reads the records straight from
 * IndexedDB, so that the page never receives (and the browser never clones on the page's thread) tens of
 * thousands of studies it does not show. This module reads and never writes; it is the one part of storage a
 * worker may import (layer rule).
 */
const open = new Map<string, CapstanDatabase>();

/** Every live record the ranking and the review need, from the database the page has already opened. */
export async function readPortfolioRecords(databaseName: string): ReturnType<typeof loadPortfolioRecords> {
  let db = open.get(databaseName);
  if (!db) {
    db = new CapstanDatabase(databaseName);
    open.set(databaseName, db);
  }
  return loadPortfolioRecords(db);
}
