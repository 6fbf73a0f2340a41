// The audit log: who did what, when.
import { and, desc, eq, lt } from 'drizzle-orm';
import type { Database } from '../connect';
import { auditEvents, users } from '../schema';

export interface AuditEntry {
	teamId: string;
	actorId: string | null;
	action: string;
	subjectType: string;
	subjectId?: string | null;
	detail?: Record<string, unknown>;
}

/** Appends one event. */
export async function recordAudit(db: Database, entry: AuditEntry) {
	await db.insert(auditEvents).values({ ...entry, subjectId: entry.subjectId ?? null, detail: entry.detail ?? {} });
}

/** A team's newest events with the actor's name. */
export function auditOfTeam(db: Database, teamId: string, limit = 200, before?: number) {
	return db
		.select({
			id: auditEvents.id,
			action: auditEvents.action,
			subjectType: auditEvents.subjectType,
			subjectId: auditEvents.subjectId,
			detail: auditEvents.detail,
			createdAt: auditEvents.createdAt,
			actorName: users.name,
			actorEmail: users.email
		})
		.from(auditEvents)
		.leftJoin(users, eq(users.id, auditEvents.actorId))
		.where(before ? and(eq(auditEvents.teamId, teamId), lt(auditEvents.id, before)) : eq(auditEvents.teamId, teamId))
		.orderBy(desc(auditEvents.id))
		.limit(limit);
}
