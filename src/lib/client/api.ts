/** Calling our JSON API from the browser: errors come back as { error: { code, message } }. */
export class ApiFailure extends Error {
	constructor(
		readonly status: number,
		readonly code: string,
		message: string
	) {
		super(message);
	}
}

export async function apiFetch<T>(path: string, init: RequestInit & { json?: unknown } = {}): Promise<T> {
	const { json, ...rest } = init;
	const response = await fetch(path, {
		...rest,
		headers: {
			accept: 'application/json',
			...(json !== undefined ? { 'content-type': 'application/json' } : {}),
			...rest.headers
		},
		body: json !== undefined ? JSON.stringify(json) : rest.body
	});
	const body = await response.json().catch(() => null);
	if (!response.ok) {
		throw new ApiFailure(
			response.status,
			body?.error?.code ?? 'error',
			body?.error?.message ?? `The server answered ${response.status}`
		);
	}
	return body as T;
}
