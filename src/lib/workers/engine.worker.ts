/// <reference lib="webworker" />
/**
 * The engine worker: runs core computations off the page's main thread. Every task type is a
 * handler in `handlers.ts`; replies follow `protocol.ts`.
 */
import { handlers } from './handlers';
import { createTaskServer } from './taskServer';
import type { TaskReply, TaskRequest } from './protocol';

const scope = self as unknown as DedicatedWorkerGlobalScope;
const serve = createTaskServer(handlers, (reply: TaskReply) => scope.postMessage(reply));
scope.onmessage = (event: MessageEvent<TaskRequest>) => {
	void serve(event.data);
};
