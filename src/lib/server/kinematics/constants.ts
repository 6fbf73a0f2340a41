// Frame: ISO 8855 vehicle axes, x forward, y left, z up; z = 0 ground at design ride height.
// Every tolerance and limit of the kinematics engine lives here.

/**
 * Below this residual (mm) the last Newton step is applied through the pose's velocity; the
 * position error left is second order, about (1e-6)² / 300 mm, and the velocity measures
 * (motion ratio, the motion kinds' instant centres), read at the pose before that step, are
 * off by about the step itself: 1e-6 mm keeps them within 1e-9 of an exact solve. With the
 * cubic predictor a 1 mm heave grid still needs about 1.05 evaluations a position.
 */
export const LINEAR_FINISH_MM = 1e-6;
/** Newton iterations allowed per position before the position is declared unreachable. */
export const NEWTON_MAX_ITER = 60;
/** When a position fails, θ is walked from the last solution in steps of this (rad) to name the link. */
export const DIAGNOSE_STEP_RAD = 0.001;
/** ... for at most this many steps (about 60°). */
export const DIAGNOSE_STEPS = 1000;
/** A derivative smaller than this (mm per rad) means the driver cannot move the linkage. */
export const DRIVER_SLOPE_MIN = 1e-9;
/** Lines whose directions differ by less than this (rad) are parallel (contract: 1e-9 rad). */
export const PARALLEL_TOL_RAD = 1e-9;
/** A sweep end on the step grid within this many steps' fraction is included (contract: 1e-9). */
export const GRID_TOL = 1e-9;
/** Sweep positions are rounded to this many decimals (mm or degrees), so 0.1-type steps print cleanly. */
export const GRID_DECIMALS = 12;
/** Lengths below this (mm) are zero: coincident points, zero-length links. */
export const ZERO_LENGTH_MM = 1e-6;
/** Relative slack when a circle only just meets a sphere (rounding, not geometry). */
export const ASSEMBLY_SLACK = 1e-12;
/** Denominators smaller than this are treated as zero (toggle positions, parallel lines). */
export const TINY = 1e-12;
/** Largest continuation step in travel or rack (mm); longer gaps are split so no branch jumps. */
export const MAX_STEP_MM = 5;
/** Largest continuation step in roll (rad), about 0.5 degrees. */
export const MAX_STEP_ROLL_RAD = 0.5 * (Math.PI / 180);
/** Largest grid a single sweep may hold, to refuse runaway requests. */
export const MAX_SAMPLES = 100_000;
/** Degrees per radian, for output only. */
export const DEG = 180 / Math.PI;
/** Radians per degree, for input only. */
export const RAD = Math.PI / 180;
