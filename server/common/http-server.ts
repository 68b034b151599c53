/**
 * The HTTP server for the Express app, making each request and answer with the app's own
 * prototypes (`app.request`, `app.response`) from the start.
 *
 * Express gives every request and answer its prototypes with `Object.setPrototypeOf` as it
 * takes them. In V8 that gives each of the two objects a map (hidden class) of its own,
 * which every property the middleware adds then extends anew; the maps live in the old
 * generation and point at the request's young objects, so every young-generation collection
 * copied and promoted each request's whole object graph. Under a steady load of 200
 * requests a second the event loop promoted about 5 MB per collection, each collection took
 * 10–40 ms and full collections came every few seconds: the tail of the API's latency.
 * Made with the right prototypes, Express's own `setPrototypeOf` changes nothing (V8 returns
 * at once when the prototype is already the one asked for) and a request's objects die
 * young, as they should.
 */
import http, { type IncomingMessage, type Server, type ServerResponse } from 'node:http';
import type { Socket } from 'node:net';
import type { Express } from 'express';

type Constructor = (this: object, ...args: unknown[]) => void;

interface MessageClasses {
  IncomingMessage: typeof IncomingMessage;
  ServerResponse: typeof ServerResponse;
}

/** Whether `fn` is an ES class (cannot be called on an object made elsewhere). */
const isClass = (fn: unknown) =>
  typeof fn === 'function' && /^class[\s{]/.test(Function.prototype.toString.call(fn));

/**
 * Request and answer constructors for Node's HTTP server whose instances have `app`'s
 * prototypes; undefined where Node's own are classes (a later Node), which cannot be
 * called this way: the server then makes plain ones and Express sets the prototypes.
 */
export function appMessageClasses(app: Express): MessageClasses | undefined {
  const NodeRequest = http.IncomingMessage as unknown as Constructor;
  const NodeResponse = http.ServerResponse as unknown as Constructor;
  if (isClass(NodeRequest) || isClass(NodeResponse)) return undefined;
  function AppRequest(this: object, socket: Socket) {
    NodeRequest.call(this, socket);
  }
  AppRequest.prototype = app.request;
  function AppResponse(this: object, req: IncomingMessage, options?: object) {
    NodeResponse.call(this, req, options);
  }
  AppResponse.prototype = app.response;
  return {
    IncomingMessage: AppRequest as unknown as typeof IncomingMessage,
    ServerResponse: AppResponse as unknown as typeof ServerResponse,
  };
}

/** An HTTP server for `app` (not yet listening), its messages made as `appMessageClasses` says. */
export function createHttpServer(app: Express): Server {
  const classes = appMessageClasses(app);
  return classes ? http.createServer(classes, app) : http.createServer(app);
}

/** Listens on `port` and `host`; resolves with the server once it does. */
export function listenHttp(app: Express, port: number, host: string): Promise<Server> {
  const server = createHttpServer(app);
  return new Promise((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, host, () => {
      server.off('error', reject);
      resolve(server);
    });
  });
}
