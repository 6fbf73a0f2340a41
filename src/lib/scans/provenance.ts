// How a point's source reads on the revision page and the share sheet (client-safe).
export interface PointSourceView {
	point: string;
	scanName: string;
	fit: string;
	residualMm: number | null;
	pointsUsed: number | null;
}

const FIT_LABELS: Record<string, string> = {
	point: 'picked point',
	sphere: 'sphere fit',
	cylinder: 'cylinder fit',
	plane_circle: 'hub face fit (plane and circle)'
};

/** "scan corner.stl · sphere fit · RMS 0.041 mm · 812 points" */
export function describeSource(s: PointSourceView): string {
	const parts = [`scan ${s.scanName}`, FIT_LABELS[s.fit] ?? s.fit];
	if (s.residualMm !== null) parts.push(`RMS ${s.residualMm.toFixed(3)} mm`);
	if (s.pointsUsed !== null) parts.push(`${s.pointsUsed} points`);
	return parts.join(' · ');
}
