/**
 * An error the service raises for the planner to read (unknown SKU, no run yet, a run already
 * going…). Transports answer it as a refused request (HTTP 400), not as a fault of the program.
 */
export class ServiceError extends Error {
  override name = 'ServiceError';
}
