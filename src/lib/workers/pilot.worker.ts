/// <reference lib="webworker" />
/**
 * The pilot worker: reads pilot CSV files in chunks (papaparse streaming inside this worker)
 * and estimates from them, so a large file neither freezes the page nor is held in memory
 * whole. Task handlers are in `src/lib/ui/pilot/pilotTasks.ts`; replies follow `protocol.ts`.
 */
import { pilotHandlers } from '$lib/ui/pilot/pilotTasks';
import { createTaskServer } from './taskServer';
import type { TaskReply, TaskRequest } from './protocol';

const scope = self as unknown as DedicatedWorkerGlobalScope;
const serve = createTaskServer(pilotHandlers, (reply: TaskReply) => scope.postMessage(reply));
scope.onmessage = (event: MessageEvent<TaskRequest>) => {
	void serve(event.data);
};
