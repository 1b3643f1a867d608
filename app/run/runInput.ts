/**
 * What the planning run sends a worker for one item: everything the engine needs and nothing it
 * has to look up, as plain data (structured-clone safe). The input fingerprint is taken over
 * exactly this object.
 */
import type {
  InventoryPosition,
  ItemSettings,
  PlanningOverrides,
  WorkspaceSettings,
} from '../../core/plan/types';
import type { AbcClass } from '../../core/replenish/abc';
import type { CompactHistory } from './compactHistory';

/** A forecast an earlier run made for a week that is now observed (smallest step per week). */
export interface RunPastForecast {
  week: string;
  mean: number;
  se: number;
  step: number;
}

export interface RunItemInput {
  settings: ItemSettings;
  /** Contiguous weekly history, week starts implied (see ./compactHistory). */
  history: CompactHistory;
  position: InventoryPosition;
  overrides: PlanningOverrides;
  workspace: WorkspaceSettings;
  abcClass: AbcClass | null;
  pastForecasts: RunPastForecast[];
}
