/**
 * The HTTP server for the Express app, with Express's request and response methods on the classes Node
 * constructs each request from.
 *
 * Why: Express (5.x, `app.handle`) re-points every incoming request's and response's prototype at its own
 * objects with `Object.setPrototypeOf`. V8 then has to give each of these objects a new hidden class and drops
 * its fast paths for them; measured here, an Express "hello" answer cost 160–210 µs of CPU against 30 µs for
 * Node's bare http server (`npm run bench:api`'s list endpoints spent most of their time there). Node lets the
 * server construct requests and responses from our own subclasses (`IncomingMessage` / `ServerResponse`
 * options), so we copy Express's methods onto those subclasses' prototypes and make them `app.request` /
 * `app.response`: Express's `setPrototypeOf` then sets the prototype the object already has, which V8 skips.
 * Behaviour is unchanged (same methods, same `req.app`); the same Hello cost ~40 µs after.
 */
import http from 'node:http'
import type { Express } from 'express'

/** Copy the own properties of `from` and its prototypes up to (not including) `until` onto `to`. */
function copyPrototypeChain(from: object, until: object, to: object): void {
  const chain: object[] = []
  for (let o: object | null = from; o && o !== until; o = Object.getPrototypeOf(o) as object | null)
    chain.unshift(o)
  for (const o of chain) {
    for (const key of Reflect.ownKeys(o)) {
      if (key === 'constructor') continue
      Object.defineProperty(to, key, Object.getOwnPropertyDescriptor(o, key)!)
    }
  }
}

export function createHttpServer(app: Express): http.Server {
  class AppRequest extends http.IncomingMessage {}
  class AppResponse<
    Req extends http.IncomingMessage = http.IncomingMessage,
  > extends http.ServerResponse<Req> {}
  copyPrototypeChain(app.request, http.IncomingMessage.prototype, AppRequest.prototype)
  copyPrototypeChain(app.response, http.ServerResponse.prototype, AppResponse.prototype)
  app.request = AppRequest.prototype as unknown as Express['request']
  app.response = AppResponse.prototype as unknown as Express['response']
  return http.createServer({ IncomingMessage: AppRequest, ServerResponse: AppResponse }, app)
}
