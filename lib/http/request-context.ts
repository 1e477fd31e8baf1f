import "server-only";
/**
 * The request being handled by a route handler, kept in AsyncLocalStorage by
 * the route() wrapper so that authentication can read its Authorization
 * header (personal API tokens) without each handler passing it down.
 */
import { AsyncLocalStorage } from "node:async_hooks";

const storage = new AsyncLocalStorage<Request>();

export function runWithRequest<T>(req: Request, fn: () => Promise<T>): Promise<T> {
  return storage.run(req, fn);
}

/** The current route handler's request, or undefined in pages and server actions. */
export function currentRequest(): Request | undefined {
  return storage.getStore();
}

/** The bearer token of the current request, if it carries one. */
export function currentBearerToken(): string | null {
  const header = currentRequest()?.headers.get("authorization") ?? "";
  const match = /^Bearer\s+(\S+)\s*$/i.exec(header);
  return match ? match[1] : null;
}
