/** The service wired to the real store, import and planning run: what the preview and the shell open. */
import { storeImportEngine } from './import-engine';
import { storeResults } from './results';
import { storeRunEngine } from './run-engine';
import { createService, defaultActor, type ProvisionService } from './service';

export function createAppService(storePath: string, actor = defaultActor()): ProvisionService {
  return createService({
    storePath,
    actor,
    results: storeResults,
    imports: storeImportEngine(actor),
    runs: storeRunEngine(actor),
  });
}
