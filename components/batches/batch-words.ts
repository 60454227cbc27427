import { type BatchStatus } from '../../shared/terms/batch';
import type { BatchTargetInput } from '../../shared/schemas/batch';
import { type UnitSystem } from '../../shared/terms/roles';
import { fromMillilitres } from '../../shared/units';
import { formatMass, round } from '../units';

export const statusLabels: Record<BatchStatus, string> = {
  prepared: 'Prepared',
  in_use: 'In use',
  used_up: 'Used up',
  discarded: 'Discarded',
};

export function targetText(target: BatchTargetInput, units: UnitSystem): string {
  if (target.basis === 'water_volume') {
    return units === 'us'
      ? `${round(fromMillilitres(target.millilitres, 'gal'), 3)} US gal of water`
      : `${round(target.millilitres / 1000, 3)} L of water`;
  }
  return `${formatMass(target.grams, units)} of ${target.basis === 'water_mass' ? 'water' : 'solution'}`;
}
