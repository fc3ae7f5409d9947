/**
 * Public surface of the storage area: the only part of the app that imports dexie.
 * Pages and sections use `getStore()`; tests build a `PlanStore` over their own database.
 */
import { IdentiplateDb } from './db';
import { PlanStore } from './PlanStore';

export { IdentiplateDb, DB_NAME, SCHEMA, SCHEMA_VERSION, SEEDED_KEY, type MetaRecord } from './db';
export { PlanStore, PURGE_AFTER_MS, copyTitle, makeResult, isStale, type PlanStoreOptions } from './PlanStore';
export { newId } from './newId';
export type { PlanRecord, RevisionRecord, StoredResult, SaveOutcome, PlanSummary } from './types';

let store: PlanStore | undefined;

/** The app's store over the browser database `identiplate` (opened on first use). */
export function getStore(): PlanStore {
	store ??= new PlanStore(new IdentiplateDb());
	return store;
}
