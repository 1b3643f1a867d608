/**
 * An item's input fingerprint: SHA-256 of the planning code version and the item's complete
 * planning input (history, settings, position, overrides, workspace settings, ABC class and the
 * earlier forecasts for now-observed weeks) as JSON. Two runs with the same fingerprint for an item
 * would compute the same result (the engine is deterministic), so the later run reuses the earlier.
 * The input objects are always built by the same code in the same key order, so plain
 * JSON.stringify is a stable encoding here.
 */
import { createHash } from 'node:crypto';

export function inputFingerprint(codeVersion: string, input: unknown): string {
  return createHash('sha256').update(codeVersion).update('\0').update(JSON.stringify(input)).digest('hex');
}
