import { toTaskError, type HandlerRegistry, type TaskReply, type TaskRequest } from './protocol';

/**
 * The worker side of the protocol: returns a function that runs one request with the matching
 * handler and posts progress, then the result or the error as data. Used by `engine.worker.ts`
 * and, in tests, by an in-process stand-in for a worker.
 */
export function createTaskServer(handlers: HandlerRegistry, post: (reply: TaskReply) => void): (request: TaskRequest) => Promise<void> {
	return async ({ id, type, payload }) => {
		const handler = Object.hasOwn(handlers, type) ? handlers[type] : undefined;
		if (!handler) {
			post({ id, type: 'error', error: { name: 'UnknownTask', message: `no handler for task type "${type}"; known: ${Object.keys(handlers).join(', ')}` } });
			return;
		}
		try {
			const result = await handler(payload, (progress) => post({ id, type: 'progress', progress }));
			post({ id, type: 'result', result });
		} catch (err) {
			post({ id, type: 'error', error: toTaskError(err) });
		}
	};
}
