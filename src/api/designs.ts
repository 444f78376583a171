// Design families (sister units) — GET /api/designs, GET /api/designs/:id.
import type { Recommendation } from '../../shared/schemas/result';
import { api } from './client';

export interface Design {
  id: number;
  reference: string;
  maker: string;
  windings: string;
  vectorGroup: string;
  phases: 1 | 3;
  hvKV: number;
  lvKV: number;
  tvKV: number | null;
  coolingStages: { stage: string; kVA: number }[];
  impedancePercent: number;
  impedanceBaseKVA: number;
  conductor: 'Cu' | 'Al';
  requiredCapacitance: string[];
  notes: string | null;
}

export interface DesignListItem extends Design {
  unitCount: number;
}

export interface DesignDetail extends Design {
  units: {
    id: number;
    serial: string;
    position: string;
    siteId: number;
    siteName: string;
    year: number | null;
    lastRecommendation: Recommendation | null;
  }[];
}

// GET /api/designs — every design with its number of units.
export function listDesigns(): Promise<DesignListItem[]> {
  return api.get<DesignListItem[]>('/designs');
}

// GET /api/designs/:id — one design with its sister units.
export function getDesign(id: number): Promise<DesignDetail> {
  return api.get<DesignDetail>(`/designs/${id}`);
}
