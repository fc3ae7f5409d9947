import { getContext, setContext } from 'svelte';
import type { EngineHandlers, EnginePool } from '$lib/workers';
import type { PlanSession } from '../session/PlanSession.svelte';
import type { VerdictRunner } from '../session/VerdictRunner.svelte';

/** What every notebook section can use: the open plan, the engine workers, the live verdicts. */
export interface Notebook {
	session: PlanSession;
	pool: EnginePool<EngineHandlers>;
	verdicts: VerdictRunner;
}

const KEY = Symbol('identiplate-notebook');

/** Called once by `Notebook.svelte`. */
export function setNotebook(notebook: Notebook): void {
	setContext(KEY, notebook);
}

/** For section components: the notebook they are part of. */
export function getNotebook(): Notebook {
	const notebook = getContext<Notebook | undefined>(KEY);
	if (!notebook) throw new Error('getNotebook() is only available inside the plan notebook');
	return notebook;
}
