/// <reference lib="webworker" />
/**
 * Reads and checks a master list in the background, so that a list of 20 000 rows never freezes the page: the
 * text is split into rows, every row is checked against the portfolio as it stands, and progress is posted as it
 * goes. Nothing is written here; the page shows the plan and applies it in one transaction, or drops it.
 */
import type { ContextProfile } from '../domain/context-profile';
import {
  emptyMasterListPlan,
  planMasterList,
  type ExistingPortfolio,
  type MasterListKey,
  type MasterListPlan
} from '../domain/master-list';
import { readMasterList, type MasterListText } from '../spreadsheet/master-list-csv';

export interface MasterListRequest {
  text: string;
  delimiter?: ',' | ';' | '\t';
  decimal?: '.' | ',';
  columns?: Partial<Record<MasterListKey, number>>;
  fromPeriod: string;
  existing: ExistingPortfolio;
  profiles: readonly ContextProfile[];
}

export type MasterListMessage =
  | { type: 'progress'; fraction: number; words: string }
  | { type: 'done'; list: Omit<MasterListText, 'rows'>; plan: MasterListPlan }
  | { type: 'error'; message: string };

const scope = self as unknown as DedicatedWorkerGlobalScope;

scope.onmessage = (event: MessageEvent<MasterListRequest>) => {
  const { text, delimiter, decimal, columns, fromPeriod, existing, profiles } = event.data;
  try {
    scope.postMessage({
      type: 'progress',
      fraction: 0,
      words: 'Reading the rows'
    } satisfies MasterListMessage);
    const list = readMasterList(text, { delimiter, decimal, columns });
    const { rows, ...about } = list;
    if (list.missing.length > 0) {
      scope.postMessage({
        type: 'done',
        list: about,
        plan: emptyMasterListPlan(rows.length)
      } satisfies MasterListMessage);
      return;
    }
    scope.postMessage({
      type: 'progress',
      fraction: 0.2,
      words: `Checking ${rows.length} rows`
    } satisfies MasterListMessage);
    const plan = planMasterList(rows, existing, profiles, {
      decimal: list.decimal,
      fromPeriod,
      onProgress: (checked, total) =>
        scope.postMessage({
          type: 'progress',
          fraction: 0.2 + (0.8 * checked) / total,
          words: `Checked ${checked} of ${total} rows`
        } satisfies MasterListMessage)
    });
    scope.postMessage({ type: 'done', list: about, plan } satisfies MasterListMessage);
  } catch (error) {
    scope.postMessage({
      type: 'error',
      message: `The list could not be read: ${(error as Error).message}`
    } satisfies MasterListMessage);
  }
};
