/**
 * The typed contract between the planner's screens and the service: every call the renderer may
 * make, with its arguments and answer. Types only — the renderer imports this file with
 * `import type`, and both transports (IPC for Electron, loopback HTTP for the preview) carry exactly
 * these calls. Every answer is plain JSON data; the service computed it, the screens only show it.
 */
import type {
  Flag,
  ForecastAdjustment,
  ForecastPoint,
  InventoryPosition,
  ItemSettings,
  ModelOrder,
  PlanningOverrides,
  ServiceKind,
  WorkspaceSettings,
} from '../../core/plan/types';

export type { Flag, ForecastAdjustment, ForecastPoint, ItemSettings, PlanningOverrides, WorkspaceSettings };

export type Severity = Flag['severity'];

export interface StoreInfo {
  path: string;
  items: number;
  activeItems: number;
  firstWeek: string | null;
  lastWeek: string | null;
  lastRun: { id: number; finishedAt: string | null; items: number } | null;
}

/** One line of the items overview. */
export interface ItemRow {
  sku: string;
  description: string;
  supplier: string | null;
  active: boolean;
  weeks: number;
  lastWeek: string | null;
  /** Short model label from the latest run, e.g. "ARMA(1,0,1)"; null before any run. */
  model: string | null;
  flagCount: number;
  worstSeverity: Severity | null;
  orderQty: number | null;
  reviewed: boolean;
}

/** One entry of the review queue: a flagged item with its flags, worst first. */
export interface ReviewEntry {
  sku: string;
  description: string;
  supplier: string | null;
  /** Higher is worse; the queue is sorted by it, descending. */
  score: number;
  flags: Flag[];
  reviewed: boolean;
}

export interface Complex {
  re: number;
  im: number;
}

export interface CandidateModel {
  label: string;
  order: ModelOrder;
  seasonalHarmonics: number;
  includeMean: boolean;
  aicc: number | null;
  chosen: boolean;
}

export interface DiagnosticLine {
  /** The test or check, e.g. "Ljung–Box Q(10)". */
  name: string;
  value: number | null;
  pValue: number | null;
  /** The flag code this diagnostic stands behind, if any. */
  flagCode: string | null;
  text: string;
}

export interface OrderLine {
  sku: string;
  description: string;
  supplier: string | null;
  orderQty: number;
  /** The quantity the run suggested before any planner edit. */
  suggestedQty: number;
  casePacks: number;
  reorderPoint: number;
  orderUpTo: number;
  safetyStock: number;
  intervalForecast: number;
  intervalSd: number;
  serviceLevel: number;
  serviceKind: ServiceKind;
  flags: string[];
  explanation: string[];
  /** Set when the planner edited the quantity. */
  edit: { qty: number; reason: string; at: string } | null;
}

export interface ItemResult {
  runId: number;
  model: { label: string; order: ModelOrder; seasonalHarmonics: number; includeMean: boolean };
  /** Fitted one-step values aligned with the history's weeks; null where none. */
  fitted: (number | null)[];
  forecast: ForecastPoint[];
  residualAcf: number[];
  /** Residual count n, and the ±1.96/√n band around zero computed from it by the service. */
  residualCount: number;
  acfBand: number;
  arRoots: Complex[];
  maRoots: Complex[];
  candidates: CandidateModel[];
  flags: Flag[];
  diagnostics: DiagnosticLine[];
  order: OrderLine | null;
  /** What the run did with the planner's decisions, in plain words. */
  overridesApplied: string[];
}

export interface AuditEntry {
  at: string;
  sku: string | null;
  action: string;
  detail: string;
  reason: string;
}

export interface ItemDetail {
  settings: ItemSettings;
  position: InventoryPosition | null;
  history: { weekStart: string[]; qty: (number | null)[] };
  result: ItemResult | null;
  overrides: PlanningOverrides;
  reviewed: boolean;
  audit: AuditEntry[];
}

export type ImportKind = 'sales' | 'items' | 'stock';

export interface ImportRequest {
  kind: ImportKind;
  fileName: string;
  /** The file's text as read by the screen (picked or dropped). */
  content: string;
  /** Column header → canonical field; empty means "detect". */
  mapping: Record<string, string>;
  dateOrder: 'dmy' | 'mdy' | null;
  force: boolean;
}

export interface ImportProblem {
  /** The physical line in the file (the header is line 1); null for a problem of the whole file. */
  line: number | null;
  column: string | null;
  value: string | null;
  message: string;
}

export interface ImportPreview {
  kind: ImportKind;
  header: string[];
  /** The first data rows as read, cells trimmed. */
  rows: string[][];
  /** Column header → canonical field as detected or as asked. */
  mapping: Record<string, string>;
  /** The canonical fields this kind of file accepts. */
  fields: string[];
  rowsRead: number;
  /** Line number in the file of each preview row. */
  rowLines: number[];
  problems: ImportProblem[];
  totalProblems: number;
  warnings: string[];
  /** How the file was read: delimiter, decimal mark, date order ('' when not detected). */
  format: { delimiter: string; decimal: string; dateOrder: string };
  items: number;
  weeks: number;
  unknownSkus: string[];
  /** Set when this exact file was imported before (it would be skipped unless forced). */
  alreadyImported: { at: string } | null;
}

export interface ImportOutcome {
  status: 'imported' | 'skipped' | 'rejected';
  rowsRead: number;
  items: number;
  weeks: number;
  warnings: string[];
  errors: ImportProblem[];
  mapping: Record<string, string>;
}

export interface RunProgress {
  state: 'idle' | 'running' | 'done' | 'cancelled' | 'failed';
  done: number;
  total: number;
  itemsPerSecond: number;
  secondsLeft: number | null;
  runId: number | null;
  message: string | null;
}

/** A planner decision about one item; each goes to the audit log with its reason. */
export type Decision =
  | { kind: 'accept-model'; reason: string }
  | { kind: 'pick-candidate'; candidate: string; reason: string }
  | { kind: 'adjust-forecast'; adjustment: ForecastAdjustment }
  | { kind: 'remove-adjustment'; index: number; reason: string }
  | { kind: 'fix-safety-stock'; units: number | null; reason: string }
  | { kind: 'mark-reviewed'; reviewed: boolean; reason: string };

export interface SupplierOrders {
  supplier: string;
  lines: OrderLine[];
  totalUnits: number;
}

/** Every call the screens can make. All answers are plain JSON. */
export interface ProvisionApi {
  storeInfo(): Promise<StoreInfo>;
  listItems(): Promise<ItemRow[]>;
  reviewQueue(): Promise<ReviewEntry[]>;
  getItem(sku: string): Promise<ItemDetail>;
  previewImport(request: ImportRequest): Promise<ImportPreview>;
  commitImport(request: ImportRequest): Promise<ImportOutcome>;
  startRun(options: { force: boolean }): Promise<RunProgress>;
  runProgress(): Promise<RunProgress>;
  cancelRun(): Promise<RunProgress>;
  decide(sku: string, decision: Decision): Promise<ItemDetail>;
  listOrders(): Promise<SupplierOrders[]>;
  setOrderQty(sku: string, qty: number, reason: string): Promise<SupplierOrders[]>;
  exportOrdersCsv(): Promise<{ fileName: string; csv: string }>;
  getSettings(): Promise<WorkspaceSettings>;
  saveSettings(settings: WorkspaceSettings): Promise<WorkspaceSettings>;
}

export type ApiMethod = keyof ProvisionApi;
