/**
 * Short messages at the bottom of the window, optionally with one action (usually "Undo").
 * Shown in an aria-live region by `Toasts.svelte`; each disappears after `timeoutMs`, but not
 * while the pointer or keyboard focus is on it.
 */
export interface ToastAction {
	label: string;
	run: () => void | Promise<void>;
}

export interface Toast {
	id: number;
	message: string;
	tone: 'info' | 'error';
	action?: ToastAction;
	timeoutMs: number;
}

class ToastList {
	items: Toast[] = $state([]);
	private nextId = 1;
	private timers = new Map<number, ReturnType<typeof setTimeout>>();

	/** Shows a message; returns its id. Undo toasts stay 12 s, others 6 s, errors until closed. */
	show(message: string, options: { action?: ToastAction; tone?: 'info' | 'error'; timeoutMs?: number } = {}): number {
		const tone = options.tone ?? 'info';
		const timeoutMs = options.timeoutMs ?? (tone === 'error' ? 0 : options.action ? 12_000 : 6_000);
		const toast: Toast = { id: this.nextId++, message, tone, action: options.action, timeoutMs };
		this.items = [...this.items.slice(-3), toast];
		this.resume(toast.id);
		return toast.id;
	}

	/** Stops the countdown (pointer or focus on the toast). */
	pause(id: number): void {
		clearTimeout(this.timers.get(id));
		this.timers.delete(id);
	}

	/** Restarts the countdown. */
	resume(id: number): void {
		const toast = this.items.find((t) => t.id === id);
		if (!toast || toast.timeoutMs <= 0) return;
		this.pause(id);
		this.timers.set(id, setTimeout(() => this.dismiss(id), toast.timeoutMs));
	}

	dismiss(id: number): void {
		this.pause(id);
		this.items = this.items.filter((t) => t.id !== id);
	}

	/** Runs a toast's action once and closes it. */
	async act(id: number): Promise<void> {
		const toast = this.items.find((t) => t.id === id);
		this.dismiss(id);
		await toast?.action?.run();
	}
}

/** The app's toasts. */
export const toasts = new ToastList();
