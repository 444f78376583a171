// The unit file's data: GET /api/units/:id as page state.
import { getUnit, type UnitDetail } from '../api/units';
import { useAsync } from './useAsync';

export function useUnit() {
  return useAsync<UnitDetail, [number]>(getUnit);
}
