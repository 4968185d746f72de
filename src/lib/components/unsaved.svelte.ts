/**
 * The question before leaving an editor with unsaved changes. Editors built on superforms pass
 * `askToLeave` as their `taintedMessage`: superforms asks it on in-app navigation (SvelteKit's
 * beforeNavigate) and lets the browser ask on tab close or reload (beforeunload).
 */
let pending = $state<((leave: boolean) => void) | null>(null);

export const leavePrompt = {
	get open() {
		return pending !== null;
	},
	answer(leave: boolean) {
		pending?.(leave);
		pending = null;
	}
};

export function askToLeave(): Promise<boolean> {
	pending?.(false);
	return new Promise((resolve) => {
		pending = resolve;
	});
}

/** The options every editor form adds to superForm. */
export const guardUnsaved = { taintedMessage: askToLeave } as const;
