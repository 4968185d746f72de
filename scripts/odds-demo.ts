/**
 * Prices the demo game's money tables with the odds lab and prints the figures that stand beside
 * them in src/lib/demo/demo.ts: `npm run odds:demo [-- --deals N --samples N --races N]`.
 */
import { parseArgs } from 'node:util';
import { priceDemo, raceLengths } from '../src/lib/demo/pricing';

const { values } = parseArgs({
	options: { deals: { type: 'string', default: '400' }, samples: { type: 'string', default: '2000' }, races: { type: 'string', default: '100000' } }
});
const t0 = performance.now();
const p = priceDemo(undefined, { deals: Number(values.deals), samples: Number(values.samples), races: Number(values.races) });
const pct = (xs: number[]) => xs.map((x) => (x * 100).toFixed(1)).join(' / ');
const coins = (x: number) => (x >= 0 ? '+' : '') + x.toFixed(2);

console.log('Stage tables: the leader at the start of the stage, P(1st … 6th) in %');
for (const l of p.leaders) console.log(`  ${l.position} (${l.leader}): ${pct(l.places)}`);
console.log(`  over the positions: ${pct(p.leaderPlaces)}  (standard errors ${pct(p.leaderStandardErrors)})`);
console.log(`\nWhole races (${p.race.races.toLocaleString('en')}): mean stages ${p.race.meanStages.toFixed(2)}, ` +
	p.race.stageCounts.map((s) => `${s.stages}: ${(s.probability * 100).toFixed(1)}%`).join(', '));
console.log(`  P(1st) per snail ${pct(p.race.final.map((r) => r[0]))}; P(last) ${pct(p.race.final.map((r) => r[r.length - 1]))}`);
console.log('\nExpected coins per card (target, band; table average = a pick at random)');
for (const t of p.tables) {
	const lo = Math.min(...t.cards.map((c) => c.expectedCoins));
	const hi = Math.max(...t.cards.map((c) => c.expectedCoins));
	const se = Math.max(...t.cards.map((c) => c.standardError));
	const range = lo === hi ? coins(lo) : `${coins(lo)} … ${coins(hi)}`;
	console.log(`  ${t.table.id.padEnd(12)} ${range} ±${se.toFixed(2)}  target ${coins(t.target)} [${coins(t.band[0])}, ${coins(t.band[1])}]  average ${coins(t.blindCoins)}`);
}
console.log('\nRace length per player count (20,000 whole races each, seed 11)');
for (const r of raceLengths()) {
	const short = r.stageCounts.filter((s) => s.stages <= 3).reduce((a, s) => a + s.probability, 0);
	console.log(`  ${r.players} players, ${r.spaces} spaces: ${r.meanStages.toFixed(2)} stages (3 or fewer ${(short * 100).toFixed(1)}%), ${r.turnsEach.toFixed(1)} turns each`);
}
console.log(`\n${((performance.now() - t0) / 1000).toFixed(1)} s`);
