import { t60FromDecayRate } from '../../../../shared/engine/mode-decay';
import type { ComputeResult } from '../../../lib/live-session/session-connection';
import { formatCount, formatHz, formatT60 } from './quantity-format';
import { formatSi } from './si-prefix';

/** The headline figures of a result as the results panel writes them. */
export interface ResultFigures {
  f0: string;
  modesKept: string;
  totalEnergy: string;
  firstModeT60: string;
}

export function resultFigures(result: ComputeResult): ResultFigures {
  return {
    f0: formatHz(result.f0Hz),
    modesKept: formatCount(result.modeCount),
    totalEnergy: formatSi(result.totalEnergyJ, 'J'),
    firstModeT60: result.modeCount > 0 ? formatT60(t60FromDecayRate(result.decayRatePerS[0])) : '—',
  };
}
