// The audit log: who did what, when.
import type { Database } from '../connect';
import { auditEvents } from '../schema';

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
