// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm, angles in radians.
// The rocker (pushrod or pullrod): once the chain has placed the arms and the upright, the rocker
// turns about its pivot axis so that the rod keeps its length — one closed-form step (a circle
// meeting a sphere) on any chain — and works the spring from its spring end.

import { SPRING_LOWER, SPRING_UPPER, type CornerModel } from './corner';
import { place } from './pose';
import { bodyVelocity, circleRoot, onCircle, root, rootIn, sub3, type Branch, type Pose } from './solve';
import { cross } from './vec3';

const cs = new Float64Array(2);
const tmp = new Float64Array(3);
const dE = new Float64Array(3);
const dS = new Float64Array(3);

/** Place the rod's outer end, turn the rocker until the rod fits (branch nearest ref), place its spring end; false when the rod cannot reach. */
export function placeRocker(m: CornerModel, ref: Branch, p: Pose): boolean {
	const k = m.rocker!;
	const O = p.rodOuter;
	if (k.rodOn === SPRING_LOWER) onCircle(O, k.rodOuterCircle, p.csTheta);
	else if (k.rodOn === SPRING_UPPER) {
		cs[0] = p.branch.phiC;
		cs[1] = p.branch.phiS;
		onCircle(O, k.rodOuterCircle, cs);
	} else place(O, p.R, k.rodOuterBody, p.L);
	const c = k.rodEnd;
	const Dx = c.c[0] - O[0];
	const Dy = c.c[1] - O[1];
	const Dz = c.c[2] - O[2];
	rootIn[0] = 2 * (Dx * c.r[0] + Dy * c.r[1] + Dz * c.r[2]);
	rootIn[1] = 2 * (Dx * c.s[0] + Dy * c.s[1] + Dz * c.s[2]);
	rootIn[2] = k.rodLength * k.rodLength - (Dx * Dx + Dy * Dy + Dz * Dz) - (c.r[0] * c.r[0] + c.r[1] * c.r[1] + c.r[2] * c.r[2]);
	rootIn[3] = ref.rockerC;
	rootIn[4] = ref.rockerS;
	if (!circleRoot()) return false;
	p.branch.rockerC = root[0];
	p.branch.rockerS = root[1];
	p.rockerAngle = Math.atan2(root[1], root[0]);
	onCircle(p.rodEnd, c, root);
	onCircle(p.springEnd, k.springEnd, root);
	if (k.hasSpring) {
		sub3(tmp, p.springEnd, m.springChassis);
		p.springLength = Math.sqrt(tmp[0] * tmp[0] + tmp[1] * tmp[1] + tmp[2] * tmp[2]);
	}
	return true;
}

/**
 * Rocker rate per unit of the chain's driver: the rod keeps its length, (E − O)·(dE − dO) = 0 with
 * dE = β' e × (E − c); then the spring length's rate. False at a rocker toggle (rod along the rocker's motion).
 */
export function rockerVelocity(m: CornerModel, p: Pose): boolean {
	const k = m.rocker!;
	const dO = p.dRodOuter;
	if (k.rodOn === SPRING_LOWER || k.rodOn === SPRING_UPPER) {
		const arm = k.rodOuterCircle;
		cross(dO, arm.e, sub3(tmp, p.rodOuter, arm.c));
		const rate = k.rodOn === SPRING_UPPER ? p.dPhi : 1;
		dO[0] *= rate;
		dO[1] *= rate;
		dO[2] *= rate;
	} else bodyVelocity(p, p.rodOuter, dO);
	const c = k.rodEnd;
	cross(dE, c.e, sub3(tmp, p.rodEnd, c.c));
	sub3(tmp, p.rodEnd, p.rodOuter);
	const den = tmp[0] * dE[0] + tmp[1] * dE[1] + tmp[2] * dE[2];
	if (Math.abs(den) < 1e-9 * k.rodLength) return false;
	const beta = (tmp[0] * dO[0] + tmp[1] * dO[1] + tmp[2] * dO[2]) / den;
	p.dRocker = beta;
	if (!k.hasSpring || !(p.springLength > 0)) return true;
	cross(dS, c.e, sub3(tmp, p.springEnd, c.c));
	sub3(tmp, p.springEnd, m.springChassis);
	p.dSpringLength = (beta * (tmp[0] * dS[0] + tmp[1] * dS[1] + tmp[2] * dS[2])) / p.springLength;
	return true;
}
