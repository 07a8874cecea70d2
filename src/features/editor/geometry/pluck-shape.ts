// The pluck's shape is shared with the server's document checks: it lives in shared/collab/pluck-shape.ts.
export { PLUCK_CAP_POINTS, clampPluckPositionM, pluckShape, type PluckRequest, type PluckShape } from '../../../../shared/collab/pluck-shape';
