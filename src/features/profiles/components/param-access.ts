import type { OrganismParams } from '../../../../shared/schemas/organism.schema.ts';
import type { ParameterKey } from '../../../../shared/schemas/organism-parameters.ts';

/** The numeric parameters the what-if can move, for a profile as it is (groups that are off are left out). */
export function movableParameters(params: OrganismParams): ParameterKey[] {
  const keys: ParameterKey[] = ['settlingVelocityMPerDay'];
  if (params.swimming) keys.push('swimming.speedMPerHour');
  if (params.growth) {
    if (params.growth.maxRatePerDay !== null) keys.push('growth.maxRatePerDay');
    keys.push('growth.temperatureC', 'growth.lightAttenuationPerM');
  }
  keys.push('mortalityPerDay');
  if (params.bedExchange) keys.push('bedExchange.criticalStressPa');
  return keys;
}

export function numericValue(params: OrganismParams, key: ParameterKey): number | null {
  switch (key) {
    case 'settlingVelocityMPerDay':
    case 'mortalityPerDay':
    case 'initialCellsPerL':
    case 'triggerCellsPerL':
    case 'schmidtNumber':
      return params[key];
    case 'swimming.speedMPerHour':
      return params.swimming?.speedMPerHour ?? null;
    case 'growth.maxRatePerDay':
      return params.growth?.maxRatePerDay ?? null;
    case 'growth.temperatureC':
      return params.growth?.temperatureC ?? null;
    case 'growth.lightAttenuationPerM':
      return params.growth?.lightAttenuationPerM ?? null;
    case 'bedExchange.criticalStressPa':
      return params.bedExchange?.criticalStressPa ?? null;
    default:
      return null;
  }
}

/** A copy of the params with one numeric parameter changed. */
export function withValue(params: OrganismParams, key: ParameterKey, value: number): OrganismParams {
  switch (key) {
    case 'settlingVelocityMPerDay':
    case 'mortalityPerDay':
    case 'initialCellsPerL':
    case 'triggerCellsPerL':
    case 'schmidtNumber':
      return { ...params, [key]: value };
    case 'swimming.speedMPerHour':
      return params.swimming ? { ...params, swimming: { ...params.swimming, speedMPerHour: value } } : params;
    case 'growth.maxRatePerDay':
      return params.growth ? { ...params, growth: { ...params.growth, maxRatePerDay: value } } : params;
    case 'growth.temperatureC':
      return params.growth ? { ...params, growth: { ...params.growth, temperatureC: value } } : params;
    case 'growth.lightAttenuationPerM':
      return params.growth ? { ...params, growth: { ...params.growth, lightAttenuationPerM: value } } : params;
    case 'bedExchange.criticalStressPa':
      return params.bedExchange ? { ...params, bedExchange: { ...params.bedExchange, criticalStressPa: value } } : params;
    default:
      return params;
  }
}
