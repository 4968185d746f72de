/** A team's printer profiles, kept by printers and designers, versioned against lost updates. */
import { and, asc, eq } from 'drizzle-orm';
import type { Db } from './db';
import { printerProfiles } from './db/schema';
import type { PrinterProfile } from '$lib/schemas/printing';
import { logActivity } from './activity';

export class ProfileError extends Error {
	constructor(
		readonly status: 404 | 409,
		message: string
	) {
		super(message);
	}
}

const fields = (p: PrinterProfile) => ({
	name: p.name,
	paper: p.paper,
	customWidthMm: p.paper === 'custom' ? (p.customWidthMm ?? null) : null,
	customHeightMm: p.paper === 'custom' ? (p.customHeightMm ?? null) : null,
	marginMm: p.marginMm,
	layout: p.layout,
	marks: p.marks,
	duplex: p.duplex,
	backOffsetXMm: p.backOffsetXMm,
	backOffsetYMm: p.backOffsetYMm,
	colour: p.colour
});

type Row = typeof printerProfiles.$inferSelect;
export const asProfile = (r: Row): PrinterProfile & { id: string; version: number } => ({
	id: r.id,
	name: r.name,
	paper: r.paper,
	...(r.customWidthMm ? { customWidthMm: r.customWidthMm } : {}),
	...(r.customHeightMm ? { customHeightMm: r.customHeightMm } : {}),
	marginMm: r.marginMm,
	layout: r.layout,
	marks: r.marks,
	duplex: r.duplex,
	backOffsetXMm: r.backOffsetXMm,
	backOffsetYMm: r.backOffsetYMm,
	colour: r.colour,
	version: r.version
});

export async function profilesOf(db: Db, teamId: string) {
	return (await db.select().from(printerProfiles).where(eq(printerProfiles.teamId, teamId)).orderBy(asc(printerProfiles.name))).map(asProfile);
}

export async function findProfile(db: Db, teamId: string, id: string) {
	const [row] = await db.select().from(printerProfiles).where(and(eq(printerProfiles.teamId, teamId), eq(printerProfiles.id, id)));
	if (!row) throw new ProfileError(404, 'No such printer profile in this team');
	return asProfile(row);
}

/** Creates (no id) or saves (id + version) a profile. */
export async function saveProfile(db: Db, teamId: string, p: PrinterProfile, userId: string) {
	if (!p.id) {
		const [row] = await db.insert(printerProfiles).values({ teamId, ...fields(p) }).returning();
		await logActivity(db, { teamId, userId, action: 'profile.created', detail: { name: p.name } });
		return asProfile(row);
	}
	const current = await findProfile(db, teamId, p.id);
	if (p.version !== undefined && p.version !== current.version) {
		throw new ProfileError(409, 'Someone saved this profile after you opened it; reload to see their changes.');
	}
	const [row] = await db
		.update(printerProfiles)
		.set({ ...fields(p), version: current.version + 1 })
		.where(and(eq(printerProfiles.id, p.id), eq(printerProfiles.version, current.version)))
		.returning();
	if (!row) throw new ProfileError(409, 'Someone saved this profile after you opened it; reload to see their changes.');
	await logActivity(db, { teamId, userId, action: 'profile.saved', detail: { name: p.name } });
	return asProfile(row);
}

export async function deleteProfile(db: Db, teamId: string, id: string, userId: string) {
	const gone = await db.delete(printerProfiles).where(and(eq(printerProfiles.teamId, teamId), eq(printerProfiles.id, id))).returning();
	if (!gone.length) throw new ProfileError(404, 'No such printer profile in this team');
	await logActivity(db, { teamId, userId, action: 'profile.deleted', detail: { name: gone[0].name } });
}
