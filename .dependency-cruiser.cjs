/**
 * What may import what (README, "How the code is organised"), checked by `npm run check`:
 * routes never reach the database or the ORM, services leave HTTP to $lib/server/http, engine
 * modules know nothing of the framework, the server or the UI, and nothing imports in a circle
 * inside an engine.
 */
const ENGINE = '^src/lib/(print|game|art|odds)/';
const NOT_TEST = '\\.(test|spec)\\.ts$|/testing/';

module.exports = {
	forbidden: [
		{
			name: 'routes-no-database',
			comment: 'A route calls a service; only services open the database or use the ORM.',
			severity: 'error',
			from: { path: '^src/routes/' },
			to: { path: ['^src/lib/server/db/', 'node_modules/(drizzle-orm|pg|@electric-sql/pglite)/'] }
		},
		{
			name: 'services-no-http',
			comment: 'Services take (db, actor, data) and refuse in domain terms; HTTP lives in $lib/server/http.',
			severity: 'error',
			from: { path: '^src/lib/server/', pathNot: ['^src/lib/server/http/', NOT_TEST] },
			to: { path: ['node_modules/@sveltejs/kit/', '^\\$app/', '^src/lib/server/http/'] }
		},
		{
			name: 'engines-stand-alone',
			comment: 'Engine modules are plain TypeScript: no framework, database, server or UI import.',
			severity: 'error',
			from: { path: ENGINE, pathNot: NOT_TEST },
			to: {
				path: [
					'node_modules/(@sveltejs/kit|drizzle-orm|pg|svelte)/',
					'^\\$app/',
					'^src/lib/(server|components|client|demo)/'
				]
			}
		},
		{
			name: 'game-model-first',
			comment: 'The game model imports no other engine.',
			severity: 'error',
			from: { path: '^src/lib/game/', pathNot: NOT_TEST },
			to: { path: '^src/lib/(print|art|odds)/' }
		},
		{
			name: 'no-circles-in-engines',
			severity: 'error',
			from: { path: ENGINE, pathNot: NOT_TEST },
			to: { circular: true, path: ENGINE }
		},
		{
			name: 'ui-no-server',
			comment: 'Components are UI only; data comes through loads and the API.',
			severity: 'error',
			from: { path: '^src/lib/components/' },
			to: { path: '^src/lib/server/' }
		}
	],
	options: {
		doNotFollow: { path: 'node_modules' },
		exclude: { path: '^src/lib/paraglide|\\.svelte-kit' },
		tsConfig: { fileName: 'tsconfig.depcruise.json' },
		tsPreCompilationDeps: true,
		enhancedResolveOptions: { exportsFields: ['exports'], conditionNames: ['import', 'require', 'node', 'default', 'types'], extensions: ['.ts', '.js', '.svelte', '.json'] }
	}
};
