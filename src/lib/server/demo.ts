/**
 * Demo mode: on first start with an empty database, one team with an account per role and
 * the demo game. These accounts exist only in demo mode (PADDOCK_DEMO=0 turns it off).
 */
import { count } from 'drizzle-orm';
import type { Db } from './db';
import { users, memberships, type Role } from './db/schema';
import { createUser, findUserByEmail } from './users';
import { createTeam } from './teams';
import { createGameFrom } from './game-io';
import { demoGameWithArt } from '$lib/demo/demo-art';
import { demoScenarios } from '$lib/demo/pricing';
import { gameActorOf, teamActorOf } from './actor';
import { saveScenario } from './odds';
import { saveProfile } from './printer-profiles';
import { cutProof, releaseProof } from './proofs';
import { DEFAULT_PROFILE } from '$lib/schemas/printing';

export const DEMO_PASSWORD = 'paddock-demo';
export const DEMO_ROLES: Role[] = ['owner', 'designer', 'artist', 'printer', 'reviewer'];
export const demoEmail = (role: Role) => `${role}@paddock.test`;

const NAMES: Record<Role, string> = {
	owner: 'Olive Ashdown',
	designer: 'Dara Fenwick',
	artist: 'Ari Quillon',
	printer: 'Pim Castellan',
	reviewer: 'Rue Marchetti'
};

/** The start-up log's line on how to sign in, when the demo accounts exist (they are made only in an empty database). */
export async function demoSignInNote(db: Db): Promise<string | null> {
	if (!(await findUserByEmail(db, demoEmail('owner')))) return null;
	const names = DEMO_ROLES.map((r) => `${r}@`).join(', ');
	return `Demo mode: sign in as ${names.replace(/, ([^,]*)$/, ' or $1')}paddock.test with the password ${DEMO_PASSWORD} (PADDOCK_DEMO=0 turns demo mode off).`;
}

export async function seedDemo(db: Db): Promise<boolean> {
	const [{ n }] = await db.select({ n: count() }).from(users);
	if (n > 0) return false;
	const accounts = new Map<Role, string>();
	for (const role of DEMO_ROLES) {
		const user = await createUser(db, { email: demoEmail(role), name: NAMES[role], password: DEMO_PASSWORD });
		accounts.set(role, user.id);
	}
	const team = await createTeam(db, { userId: accounts.get('owner')!, name: NAMES.owner }, { name: 'Mossbank Games' });
	for (const role of DEMO_ROLES.filter((r) => r !== 'owner')) {
		await db.insert(memberships).values({ teamId: team.id, userId: accounts.get(role)!, role });
	}
	const printer = teamActorOf({ id: accounts.get('printer')!, name: NAMES.printer }, team.id, 'printer');
	await saveProfile(db, printer, { ...DEFAULT_PROFILE, name: 'Office laser, A4 duplex', backOffsetXMm: 0.8, backOffsetYMm: -0.5 });
	await saveProfile(db, printer, { ...DEFAULT_PROFILE, name: 'Print shop, Letter, CMYK', paper: 'letter', layout: 'butted', marginMm: 6.35, colour: 'cmyk' });
	const { game, art } = await demoGameWithArt();
	const row = await createGameFrom(db, { teamId: team.id, userId: accounts.get('designer')!, game, art });
	// The start-of-stage positions the money tables were priced on, saved so a visitor can re-run them.
	const designerActor = gameActorOf({ id: accounts.get('designer')!, name: NAMES.designer }, 'designer', row);
	for (const { name, scenario } of demoScenarios(game)) await saveScenario(db, designerActor, { name, scenario });
	// A first proof, released, so a printer has something to print straight away.
	const proof = await cutProof(db, designerActor, { description: 'First playtest print' });
	await releaseProof(db, designerActor, { proof });
	return true;
}
