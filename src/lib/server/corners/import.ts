// CSV import for a corner: runs the import library against the corner's current revision and the team's
// remembered mapping, builds the corner file, and saves it with the original upload in one transaction.
import { error } from '@sveltejs/kit';
import { kindSpec, splitRocker } from '$lib/kinds';
import { z } from 'zod';
import { cornerGeometrySchema, formatIssue, type CornerGeometry } from '$lib/schemas/geometry';
import { importCorner, type ImportPreview } from '$lib/server/import';
import { db } from '$lib/server/db';
import { latestRevision, revisionOfCorner } from '$lib/server/db/queries/corners';
import { setTeamSetting, teamSettings } from '$lib/server/db/queries/teams';
import type { Car, Corner } from '$lib/server/db/schema';
import { checkCornerFits, saveRevision, vehicleFromCar } from './revisions';

export const importMemory = z
	.object({
		columns: z.record(z.string(), z.union([z.string(), z.number()])).optional(),
		aliases: z.record(z.string(), z.string()).default({}),
		unit: z.string().optional(),
		axes: z.unknown().optional()
	})
	.catch({ aliases: {} });
export type ImportMemory = z.infer<typeof importMemory>;

/** The team's remembered import settings (column mapping, point-name aliases, unit, axes). */
export async function rememberedImport(teamId: string): Promise<ImportMemory> {
	return importMemory.parse((await teamSettings(db, teamId)).import ?? {});
}

export interface ImportRequest {
	car: Car;
	corner: Corner;
	userId: string;
	file: File;
	options: unknown;
	dryRun: boolean;
	label: string;
	note: string;
	loadedRadius?: number;
	springOn?: 'lower' | 'upper' | 'upright';
}

/** Stops with 400 in the API's shape, keeping the import's own code, row and column. */
function refuse(code: string, message: string, field?: string): never {
	error(400, { message, code, field });
}

/** The corner file the imported points make, taking tyre, spring and vehicle from the current revision or the request. */
function geometryOf(req: ImportRequest, preview: ImportPreview, current: CornerGeometry | null): CornerGeometry {
	const loaded = req.loadedRadius ?? current?.tyre.loaded_radius;
	if (loaded === undefined) refuse('invalid', 'loadedRadius: the corner has no revision yet, so give the tyre loaded radius (mm)', 'loadedRadius');
	const spec = kindSpec(req.corner.kind);
	// rocker points in the file make the rocker block; its rod rides where the current revision's did, else the kind's first choice
	const { points, rocker } = splitRocker(preview.points, current?.rocker?.rod_on ?? spec.rockerRodOn[0] ?? null);
	const raw = {
		format: 'corner-geometry/1',
		name: `${req.car.name}, ${req.corner.position.replace('_', ' ')}, imported from ${req.file.name}`,
		kind: req.corner.kind,
		points,
		...(rocker ? { rocker } : {}),
		...(points['spring.body'] && !rocker ? { spring_on: req.springOn ?? current?.spring_on ?? spec.springOn[0] } : {}),
		tyre: { loaded_radius: loaded },
		vehicle: current?.vehicle ?? vehicleFromCar(req.car, req.corner)
	};
	const parsed = cornerGeometrySchema.safeParse(raw);
	if (!parsed.success) refuse('invalid', formatIssue(parsed.error), parsed.error.issues[0]?.path.join('.'));
	return parsed.data;
}

/** The revision an import aligns onto: the corner's baseline, else its latest revision. */
export async function alignmentReference(corner: Corner) {
	const baseline = corner.baselineRevisionId ? await revisionOfCorner(db, corner.id, corner.baselineRevisionId) : null;
	return baseline ?? (await latestRevision(db, corner.id));
}

/** Previews an import, and unless dryRun saves it as a new revision with its upload. */
export async function runImport(req: ImportRequest) {
	const latest = await latestRevision(db, req.corner.id);
	const reference = await alignmentReference(req.corner);
	const current = reference ? cornerGeometrySchema.safeParse(reference.geometry) : null;
	const currentGeometry = current?.success ? current.data : null;
	const memory = await rememberedImport(req.car.teamId);
	const bytes = new Uint8Array(await req.file.arrayBuffer());
	const result = importCorner(bytes, req.options, {
		kind: req.corner.kind,
		aliases: memory.aliases,
		currentPoints: currentGeometry?.points,
		cornerSide: req.corner.position.endsWith('left') ? 'left' : 'right'
	});
	if (!result.ok) refuse(result.error.code, result.error.message, result.error.field);
	const geometry = geometryOf(req, result.preview, currentGeometry);
	if (req.dryRun) {
		// saveRevision makes the same check when saving; a preview must fail the same way.
		checkCornerFits(geometry, req.corner);
		return { preview: result.preview, geometry, saved: null };
	}
	const { revision } = await saveRevision({
		car: req.car, corner: req.corner, userId: req.userId, geometry,
		label: req.label || `imported ${req.file.name}`, note: req.note, parentId: latest?.id ?? null, source: 'import',
		upload: { teamId: req.car.teamId, filename: req.file.name || 'upload.csv', contentType: req.file.type || 'text/csv', bytes: Buffer.from(bytes), createdBy: req.userId }
	});
	await remember(req.car.teamId, memory, result.preview, req.options);
	return { preview: result.preview, geometry, saved: { id: revision.id, number: revision.number } };
}

/** Stores the mapping this import used as the team's default for the next one. */
async function remember(teamId: string, memory: ImportMemory, preview: ImportPreview, options: unknown) {
	const aliases = { ...memory.aliases };
	for (const [ours, theirs] of Object.entries(preview.sourceNames)) if (theirs !== ours) aliases[theirs] = ours;
	const o = (options ?? {}) as { unit?: string; axes?: unknown; columns?: Record<string, string | number> };
	const headers = preview.columns.headers;
	const columns = headers
		? Object.fromEntries(
				(['name', 'x', 'y', 'z', 'side'] as const)
					.filter((k) => preview.columns[k] !== undefined)
					.map((k) => [k, headers[preview.columns[k] as number]])
			)
		: o.columns;
	await setTeamSetting(db, teamId, 'import', { aliases, columns, unit: o.unit, axes: o.axes });
}
