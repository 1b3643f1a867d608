/** Workspace settings (table workspace_settings): one JSON value per key of `WorkspaceSettings`. */
import { DEFAULT_WORKSPACE, type WorkspaceSettings } from '../../core/plan/types';
import type { Store } from './store';

const KEYS = Object.keys(DEFAULT_WORKSPACE) as (keyof WorkspaceSettings)[];

/** The workspace settings, each key not yet set taking DEFAULT_WORKSPACE. */
export function getWorkspaceSettings(store: Store): WorkspaceSettings {
  const rows = store.db.prepare('SELECT key, value_json FROM workspace_settings').all() as {
    key: string;
    value_json: string;
  }[];
  const out = structuredClone(DEFAULT_WORKSPACE) as unknown as Record<string, unknown>;
  for (const r of rows) if ((KEYS as string[]).includes(r.key)) out[r.key] = JSON.parse(r.value_json);
  return out as unknown as WorkspaceSettings;
}

/** Store the given keys (others untouched); returns the settings after the change. */
export function putWorkspaceSettings(store: Store, patch: Partial<WorkspaceSettings>): WorkspaceSettings {
  const upsert = store.db.prepare(
    'INSERT INTO workspace_settings (key, value_json) VALUES (?, ?) ON CONFLICT (key) DO UPDATE SET value_json = excluded.value_json',
  );
  store.transaction(() => {
    for (const key of KEYS) {
      if (patch[key] !== undefined) upsert.run(key, JSON.stringify(patch[key]));
    }
  });
  return getWorkspaceSettings(store);
}
