/** A team's printer profiles, kept by printers and designers, versioned against lost updates. */
import { and, asc, eq, sql } from 'drizzle-orm';
import type { Db } from './db';
import { games, printerProfiles } from './db/schema';
import { DEFAULT_INK_LIMIT_PCT, type PressCondition, type PrinterProfile } from '$lib/schemas/printing';
import { checkPressProfile } from '$lib/print/colour/icc';
import { PressColour, type PressProfile } from '$lib/print/colour/cmm';
import { BUILTIN_CONDITION, BUILTIN_PROFILE_NAME, builtinPressProfile } from '$lib/print/colour/press-profiles';
import { logActivity } from './activity';
import type { GameActor, TeamActor } from './actor';
import { NotFound, Conflict, Invalid } from './refusals';

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
	colour: p.colour,
	output: p.output,
	intent: p.intent
});

type Row = typeof printerProfiles.$inferSelect;
export const asProfile = (r: Row): PrinterProfile & { id: string; version: number; press: PressSummary } => ({
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
	output: r.output,
	intent: r.intent,
	press: pressSummary(r),
	version: r.version
});

/** What the profile prints PDF/X for, in words (never the ICC bytes themselves). */
export interface PressSummary {
	/** True when the printer uploaded their own ICC profile. */
	custom: boolean;
	profileName: string;
	conditionIdentifier: string;
	condition: string;
	totalInkLimitPct: number;
	iccBytes?: number;
}

function pressSummary(r: Row): PressSummary {
	if (!r.iccProfile)
		return { custom: false, profileName: BUILTIN_PROFILE_NAME, ...BUILTIN_CONDITION };
	return {
		custom: true,
		profileName: r.iccName ?? 'Uploaded profile',
		conditionIdentifier: r.pressCondition ?? 'Custom',
		condition: r.pressConditionInfo ?? '',
		totalInkLimitPct: r.inkLimitPct ?? DEFAULT_INK_LIMIT_PCT,
		iccBytes: r.iccProfile.length
	};
}

/** The game's default press profile in words: a printer profile's, or the built-in one. */
export async function gamePressSummary(db: Db, teamId: string, pressProfileId: string | null): Promise<PressSummary & { printerProfile?: string }> {
	if (pressProfileId) {
		const [row] = await db.select().from(printerProfiles).where(and(eq(printerProfiles.teamId, teamId), eq(printerProfiles.id, pressProfileId)));
		if (row) return { ...pressSummary(row), printerProfile: row.name };
	}
	return { custom: false, profileName: BUILTIN_PROFILE_NAME, ...BUILTIN_CONDITION };
}

/** The press profile a PDF/X file of this printer profile embeds: its uploaded ICC and condition, or the built-in ones. */
export async function pressProfileOf(db: Db, teamId: string, id: string): Promise<PressProfile> {
	const [row] = await db.select().from(printerProfiles).where(and(eq(printerProfiles.teamId, teamId), eq(printerProfiles.id, id)));
	if (!row) throw new NotFound('No such printer profile in this team');
	if (!row.iccProfile) return builtinPressProfile();
	return {
		conditionIdentifier: row.pressCondition ?? 'Custom',
		condition: row.pressConditionInfo ?? '',
		registryName: row.pressRegistry ?? '',
		totalInkLimitPct: row.inkLimitPct ?? DEFAULT_INK_LIMIT_PCT,
		icc: row.iccProfile
	};
}

/**
 * A printer's own ICC profile and printing condition for a profile: the header is checked
 * (CMYK output profile, size cap) and LittleCMS must be able to build its transforms, so a
 * profile that cannot convert is refused here rather than at print time.
 */
export async function setPressProfile(db: Db, actor: TeamActor, { id, icc, condition }: { id: string; icc: Uint8Array; condition: PressCondition }) {
	const { teamId, userId } = actor;
	await findProfile(db, teamId, id);
	let description: string;
	try {
		checkPressProfile(icc);
		description = (await PressColour.open(icc)).description;
	} catch (e) {
		throw new Invalid((e as Error).message);
	}
	const [row] = await db
		.update(printerProfiles)
		.set({
			iccProfile: icc,
			iccName: description.slice(0, 120) || 'Uploaded profile',
			pressCondition: condition.conditionIdentifier,
			pressConditionInfo: condition.condition,
			pressRegistry: condition.registryName,
			inkLimitPct: condition.totalInkLimitPct,
			version: sql`${printerProfiles.version} + 1`
		})
		.where(and(eq(printerProfiles.teamId, teamId), eq(printerProfiles.id, id)))
		.returning();
	await logActivity(db, { teamId, userId, action: 'profile.press', detail: { name: row.name, condition: condition.conditionIdentifier } });
	return asProfile(row);
}

/** Back to the built-in press profile. */
export async function clearPressProfile(db: Db, actor: TeamActor, { id }: { id: string }) {
	const { teamId, userId } = actor;
	await findProfile(db, teamId, id);
	const [row] = await db
		.update(printerProfiles)
		.set({ iccProfile: null, iccName: null, pressCondition: null, pressConditionInfo: null, pressRegistry: null, inkLimitPct: null, version: sql`${printerProfiles.version} + 1` })
		.where(and(eq(printerProfiles.teamId, teamId), eq(printerProfiles.id, id)))
		.returning();
	await logActivity(db, { teamId, userId, action: 'profile.press', detail: { name: row.name, condition: BUILTIN_CONDITION.conditionIdentifier } });
	return asProfile(row);
}

export async function profilesOf(db: Db, teamId: string) {
	return (await db.select().from(printerProfiles).where(eq(printerProfiles.teamId, teamId)).orderBy(asc(printerProfiles.name))).map(asProfile);
}

export async function findProfile(db: Db, teamId: string, id: string) {
	const [row] = await db.select().from(printerProfiles).where(and(eq(printerProfiles.teamId, teamId), eq(printerProfiles.id, id)));
	if (!row) throw new NotFound('No such printer profile in this team');
	return asProfile(row);
}

/** Creates (no id) or saves (id + version) a profile. */
export async function saveProfile(db: Db, actor: TeamActor, p: PrinterProfile) {
	const { teamId, userId } = actor;
	if (!p.id) {
		const [row] = await db.insert(printerProfiles).values({ teamId, ...fields(p) }).returning();
		await logActivity(db, { teamId, userId, action: 'profile.created', detail: { name: p.name } });
		return asProfile(row);
	}
	const current = await findProfile(db, teamId, p.id);
	if (p.version !== undefined && p.version !== current.version) {
		throw new Conflict('Someone saved this profile after you opened it; reload to see their changes.');
	}
	const [row] = await db
		.update(printerProfiles)
		.set({ ...fields(p), version: current.version + 1 })
		.where(and(eq(printerProfiles.id, p.id), eq(printerProfiles.version, current.version)))
		.returning();
	if (!row) throw new Conflict('Someone saved this profile after you opened it; reload to see their changes.');
	await logActivity(db, { teamId, userId, action: 'profile.saved', detail: { name: p.name } });
	return asProfile(row);
}

export async function deleteProfile(db: Db, actor: TeamActor, { id }: { id: string }) {
	const { teamId, userId } = actor;
	const gone = await db.delete(printerProfiles).where(and(eq(printerProfiles.teamId, teamId), eq(printerProfiles.id, id))).returning();
	if (!gone.length) throw new NotFound('No such printer profile in this team');
	await logActivity(db, { teamId, userId, action: 'profile.deleted', detail: { name: gone[0].name } });
}

/**
 * The game's default press profile: a printer profile of the game's team (its uploaded ICC or
 * the built-in one), or null for the built-in profile. PDF/X files, soft proofs and the print
 * page use it whenever no printer profile is named.
 */
export async function setGamePressProfile(db: Db, actor: GameActor, { profileId }: { profileId: string | null }) {
	const { gameId } = actor;
	const profile = profileId ? await findProfile(db, actor.teamId, profileId) : null;
	const [row] = await db
		.update(games)
		.set({ pressProfileId: profile?.id ?? null, updatedAt: new Date() })
		.where(and(eq(games.id, gameId), eq(games.teamId, actor.teamId)))
		.returning({ id: games.id });
	if (!row) throw new NotFound('No such game in this team');
	const summary = await gamePressSummary(db, actor.teamId, profile?.id ?? null);
	await logActivity(db, {
		teamId: actor.teamId,
		gameId,
		userId: actor.userId,
		action: 'game.press',
		detail: { profile: profile?.name ?? null, condition: summary.conditionIdentifier }
	});
	return summary;
}
