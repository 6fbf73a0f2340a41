// The scan view: the scan, its corner's newest revision (the overlay, the names to assign, the datum targets).
import { error } from '@sveltejs/kit';
import { joinRocker, tablePoints } from '$lib/kinds';
import { cornerGeometrySchema } from '$lib/schemas/geometry';
import { db } from '$lib/server/db';
import { latestRevision } from '$lib/server/db/queries/corners';
import { cornerOfCar } from '$lib/server/db/queries/scans';
import { can, requireScan } from '$lib/server/permissions';
import { scanView } from '$lib/server/scans/scans';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const { scan, car, role } = await requireScan(event, event.params.scanId, 'view');
	const corner = scan.cornerId ? await cornerOfCar(db, car.id, scan.cornerId) : null;
	if (!corner) error(404, { message: 'The scan’s corner no longer exists', code: 'not_found' });
	const latest = await latestRevision(db, corner.id);
	const parsed = latest ? cornerGeometrySchema.safeParse(latest.geometry) : null;
	const geometry = parsed?.success ? parsed.data : null;
	return {
		scan: scanView(scan),
		car: { id: car.id, name: car.name },
		corner: { id: corner.id, position: corner.position, kind: corner.kind },
		revision: latest && geometry ? { id: latest.id, number: latest.number, points: joinRocker(geometry.points, geometry.rocker), loadedRadius: geometry.tyre.loaded_radius } : null,
		names: tablePoints(corner.kind, !!geometry?.rocker).map((p) => ({ name: p.name, label: p.label })),
		canEdit: can(role, 'edit')
	};
};
