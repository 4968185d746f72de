/** Teams, their members and invitations. */
import { and, eq, count, asc } from 'drizzle-orm';
import type { Db } from './db';
import { teams, memberships, invitations, users, type Role } from './db/schema';
import { newToken, sha256 } from './auth/secrets';
import { logActivity } from './activity';
import { NotFound, Conflict, Invalid, Refusal } from './refusals';
import type { Actor, TeamActor } from './actor';

export const INVITATION_TTL_MS = 7 * 24 * 60 * 60 * 1000;

/** A signed-in person starts a team and is its first owner. */
export async function createTeam(db: Db, actor: Actor, { name }: { name: string }) {
	const ownerId = actor.userId;
	return db.transaction(async (tx) => {
		const [team] = await tx.insert(teams).values({ name }).returning();
		await tx.insert(memberships).values({ teamId: team.id, userId: ownerId, role: 'owner' });
		await logActivity(tx as unknown as Db, { teamId: team.id, userId: ownerId, action: 'team.created' });
		return team;
	});
}

export async function membershipsOf(db: Db, userId: string) {
	return db
		.select({ teamId: teams.id, teamName: teams.name, role: memberships.role })
		.from(memberships)
		.innerJoin(teams, eq(teams.id, memberships.teamId))
		.where(eq(memberships.userId, userId))
		.orderBy(asc(teams.name));
}

export async function findTeam(db: Db, teamId: string) {
	const [team] = await db.select().from(teams).where(eq(teams.id, teamId));
	return team;
}

export async function membersOf(db: Db, teamId: string) {
	return db
		.select({
			userId: users.id,
			name: users.name,
			email: users.email,
			role: memberships.role,
			since: memberships.createdAt
		})
		.from(memberships)
		.innerJoin(users, eq(users.id, memberships.userId))
		.where(eq(memberships.teamId, teamId))
		.orderBy(asc(users.name));
}

export async function pendingInvitations(db: Db, teamId: string) {
	const rows = await db
		.select({
			id: invitations.id,
			email: invitations.email,
			role: invitations.role,
			expiresAt: invitations.expiresAt,
			acceptedAt: invitations.acceptedAt
		})
		.from(invitations)
		.where(eq(invitations.teamId, teamId));
	return rows.filter((r) => !r.acceptedAt && r.expiresAt > new Date());
}

export async function invite(db: Db, actor: TeamActor, { email: address, role }: { email: string; role: Role }) {
	const input = { teamId: actor.teamId, invitedBy: actor.userId, email: address, role };
	const email = input.email.trim().toLowerCase();
	const members = await membersOf(db, input.teamId);
	if (members.some((m) => m.email.toLowerCase() === email)) {
		throw new Conflict(`${email} is a member of this team already`);
	}
	const token = newToken('inv_');
	const expiresAt = new Date(Date.now() + INVITATION_TTL_MS);
	const [invitation] = await db
		.insert(invitations)
		.values({ teamId: input.teamId, email, role: input.role, tokenHash: sha256(token), invitedBy: input.invitedBy, expiresAt })
		.returning();
	await logActivity(db, {
		teamId: input.teamId,
		userId: input.invitedBy,
		action: 'member.invited',
		detail: { email, role: input.role }
	});
	return { invitation, token };
}

export async function findInvitation(db: Db, token: string) {
	const [row] = await db
		.select({ invitation: invitations, teamName: teams.name })
		.from(invitations)
		.innerJoin(teams, eq(teams.id, invitations.teamId))
		.where(eq(invitations.tokenHash, sha256(token)));
	if (!row) throw new NotFound('This invitation link is not valid. Ask for a new invitation.');
	const { invitation } = row;
	if (invitation.acceptedAt) throw new Refusal('gone', 'This invitation has been used already.');
	if (invitation.expiresAt <= new Date())
		throw new Refusal('gone', 'This invitation has expired. Ask the team owner for a new one.');
	return { ...invitation, teamName: row.teamName };
}

/** The signed-in person accepts an invitation sent to their own address. */
export async function acceptInvitation(db: Db, actor: Actor, { token }: { token: string }) {
	const invitation = await findInvitation(db, token);
	const [user] = await db.select({ id: users.id, email: users.email }).from(users).where(eq(users.id, actor.userId));
	if (!user || invitation.email !== user.email.toLowerCase()) {
		throw new Invalid(`This invitation was sent to ${invitation.email}. Sign in with that address to accept it.`
		);
	}
	return db.transaction(async (tx) => {
		const [used] = await tx
			.update(invitations)
			.set({ acceptedAt: new Date(), acceptedBy: user.id })
			.where(and(eq(invitations.id, invitation.id)))
			.returning();
		if (!used) throw new Refusal('gone', 'This invitation has been used already.');
		await tx
			.insert(memberships)
			.values({ teamId: invitation.teamId, userId: user.id, role: invitation.role })
			.onConflictDoUpdate({
				target: [memberships.teamId, memberships.userId],
				set: { role: invitation.role }
			});
		await logActivity(tx as unknown as Db, {
			teamId: invitation.teamId,
			userId: user.id,
			action: 'member.joined',
			detail: { role: invitation.role }
		});
		return invitation;
	});
}

async function ownerCount(db: Db, teamId: string) {
	const [row] = await db
		.select({ n: count() })
		.from(memberships)
		.where(and(eq(memberships.teamId, teamId), eq(memberships.role, 'owner')));
	return row.n;
}

async function memberRole(db: Db, teamId: string, userId: string) {
	const [row] = await db
		.select({ role: memberships.role })
		.from(memberships)
		.where(and(eq(memberships.teamId, teamId), eq(memberships.userId, userId)));
	if (!row) throw new NotFound('No such member');
	return row.role;
}

export async function changeRole(db: Db, actor: TeamActor, { userId, role }: { userId: string; role: Role }) {
	const { teamId, userId: by } = actor;
	const current = await memberRole(db, teamId, userId);
	if (current === 'owner' && role !== 'owner' && (await ownerCount(db, teamId)) <= 1) {
		throw new Conflict('A team needs at least one owner. Make someone else owner first.');
	}
	await db
		.update(memberships)
		.set({ role })
		.where(and(eq(memberships.teamId, teamId), eq(memberships.userId, userId)));
	await logActivity(db, { teamId, userId: by, action: 'member.role', detail: { userId, role } });
}

export async function removeMember(db: Db, actor: TeamActor, { userId }: { userId: string }) {
	const { teamId, userId: by } = actor;
	const current = await memberRole(db, teamId, userId);
	if (current === 'owner' && (await ownerCount(db, teamId)) <= 1) {
		throw new Conflict('The last owner cannot be removed. Make someone else owner first.');
	}
	await db
		.delete(memberships)
		.where(and(eq(memberships.teamId, teamId), eq(memberships.userId, userId)));
	await logActivity(db, { teamId, userId: by, action: 'member.removed', detail: { userId } });
}
