import Dexie, { type DexieOptions, type EntityTable, type Transaction } from 'dexie';
import type { PlanRecord, RevisionRecord } from './types';

/** Name of the browser database. */
export const DB_NAME = 'identiplate';

/** One key/value row of small bookkeeping facts (table `meta`). */
export interface MetaRecord {
	key: string;
	value: unknown;
}

/** `meta` key set once the demo plan was offered (so deleting every plan does not bring it back). */
export const SEEDED_KEY = 'seeded';

/**
 * Every schema version the app has written, oldest first. Each keeps its `stores` and its
 * upgrade function for ever: a browser that last ran an old version upgrades step by step.
 * Add a new version at the end; never edit a published one.
 *
 * - 1: plans by id (indexed by `updatedAt`) and revisions by id (indexed by plan and number).
 * - 2: soft delete (`deletedAt` index) and the `meta` table. Upgrade: every plan gets a
 *   `results` object and a `title` copied from its plan; a database that already holds plans
 *   is marked as seeded so the demo plan is not added to someone's existing work.
 */
export const SCHEMA: readonly {
	version: number;
	stores: Record<string, string | null>;
	upgrade?: (tx: Transaction) => Promise<void>;
}[] = [
	{
		version: 1,
		stores: { plans: 'id, updatedAt', revisions: 'id, planId, [planId+number]' }
	},
	{
		version: 2,
		stores: { plans: 'id, updatedAt, deletedAt', meta: 'key' },
		upgrade: async (tx) => {
			let count = 0;
			await tx
				.table('plans')
				.toCollection()
				.modify((record: Record<string, unknown>) => {
					count++;
					if (typeof record.results !== 'object' || record.results === null) record.results = {};
					const plan = record.plan as { title?: unknown } | undefined;
					if (typeof plan?.title === 'string') record.title = plan.title;
					else if (typeof record.title !== 'string') record.title = '';
				});
			if (count > 0) await tx.table('meta').put({ key: SEEDED_KEY, value: true });
		}
	}
];

/** The current schema version (the last entry of `SCHEMA`). */
export const SCHEMA_VERSION = SCHEMA[SCHEMA.length - 1].version;

/**
 * The Identiplate IndexedDB database. Revisions are immutable: an update of an existing
 * revision (update, modify, or put over an existing key) is refused.
 */
export class IdentiplateDb extends Dexie {
	plans!: EntityTable<PlanRecord, 'id'>;
	revisions!: EntityTable<RevisionRecord, 'id'>;
	meta!: EntityTable<MetaRecord, 'key'>;

	constructor(name: string = DB_NAME, options?: DexieOptions) {
		super(name, options);
		for (const step of SCHEMA) {
			const v = this.version(step.version).stores(step.stores);
			if (step.upgrade) v.upgrade(step.upgrade);
		}
		this.revisions.hook('updating', () => {
			throw new Error('revisions are immutable: save a new revision instead of changing one');
		});
	}
}
