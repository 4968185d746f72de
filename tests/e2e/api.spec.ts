import { test, expect, request as newRequest } from '@playwright/test';
import { signIn } from './helpers';

test('anonymous API calls get 401 as JSON', async ({ request }) => {
	for (const path of ['/api/v1/me', '/api/v1/teams']) {
		const res = await request.get(path);
		expect(res.status()).toBe(401);
		expect((await res.json()).error.code).toBe('unauthenticated');
	}
});

test('a reviewer writing to a designer-only route gets 403; cross-site writes are refused', async ({ page, baseURL }) => {
	await signIn(page, 'reviewer@paddock.test');
	const me = await (await page.request.get('/api/v1/me')).json();
	const teamId = me.memberships[0].teamId;
	const res = await page.request.post(`/api/v1/teams/${teamId}/games`, {
		data: { name: 'Not allowed' },
		headers: { origin: baseURL! }
	});
	expect(res.status()).toBe(403);
	expect((await res.json()).error.code).toBe('forbidden');

	// The same cookie, but the request comes from another site.
	const cross = await page.request.post('/api/v1/teams', {
		data: { name: 'Sneaky' },
		headers: { origin: 'http://evil.example' }
	});
	expect(cross.status()).toBe(403);
	expect((await cross.json()).error.code).toBe('cross_site');
});

test('a personal API token authenticates, and stops working once revoked', async ({ page, baseURL }) => {
	await signIn(page, 'designer@paddock.test');
	await page.goto('/account');
	await page.getByLabel('Token name').fill('build script');
	await page.getByRole('button', { name: 'Make a token' }).click();
	const token = (await page.getByTestId('new-token').textContent())!.trim();
	expect(token).toMatch(/^pdk_/);

	const api = await newRequest.newContext({ baseURL, extraHTTPHeaders: { authorization: `Bearer ${token}` } });
	const me = await api.get('/api/v1/me');
	expect(me.status()).toBe(200);
	const teamId = (await me.json()).memberships[0].teamId;
	const made = await api.post(`/api/v1/teams/${teamId}/games`, { data: { name: 'Made by script' } });
	expect(made.status()).toBe(201);
	expect((await made.json()).game.slug).toBe('made-by-script');

	// Bad input through the token: malformed JSON, oversized body, unknown id.
	const malformed = await api.post(`/api/v1/teams/${teamId}/games`, {
		headers: { 'content-type': 'application/json' },
		data: '{"name":'
	});
	expect(malformed.status()).toBe(400);
	const big = await api.post(`/api/v1/teams/${teamId}/games`, { data: { name: 'x'.repeat(2_000_000) } });
	expect(big.status()).toBe(413);
	const unknown = await api.get('/api/v1/teams/00000000-0000-4000-8000-000000000000/games');
	expect(unknown.status()).toBe(404);
	const list = await (await api.get(`/api/v1/teams/${teamId}/games`)).json();
	expect(list.games.filter((g: { name: string }) => g.name === 'Made by script')).toHaveLength(1);

	await page.goto('/account');
	await page.getByRole('row', { name: /build script/ }).getByRole('button', { name: 'Revoke' }).click();
	await expect(page.getByRole('row', { name: /build script/ })).toHaveCount(0);
	expect((await api.get('/api/v1/me')).status()).toBe(401);
	await api.dispose();
});
