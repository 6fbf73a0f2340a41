// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm.
// The shared schemas the import uses, gathered in one place for the server code.

export { importOptionsSchema, IMPORT_LIMITS, KNOWN_POINTS, type ImportOptions, type ImportOptionsInput } from '../../schemas/import';
export { REQUIRED_POINTS as REQUIRED_POINTS_BY_KIND } from '../../schemas/geometry';
