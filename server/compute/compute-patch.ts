import { modeTableMessage, type TableStamp } from '../../shared/engine/mode-table-message';
import type { Patch } from '../../shared/patch/patch-schema';
import { encodeModeTable } from '../../shared/protocol/mode-table-wire';

/** The encoded mode table of a validated patch, stamped with where it stands in the session's history. */
export function computeTableBytes(patch: Patch, previewDurationS: number, stamp: TableStamp): Uint8Array<ArrayBuffer> {
  return encodeModeTable(modeTableMessage(patch, previewDurationS, stamp));
}
