/**
 * The HTTP server for the Express app, making each request and answer with the app's own
 * prototypes (`app.request`, `app.response`) from the start.
 *
 * Express gives every request and answer its prototypes with `Object.setPrototypeOf` as it
 * takes them. Measured, not explained: with that call, V8's young-generation collections
 * kept each request's whole object graph alive, and copied and promoted it (a bare Express
 * app promoted 11 KB a request, the same app with requests made as here none; ours under 200
 * analyses a second about 5 MB per collection, each collection 10–40 ms, with full
 * collections every few seconds: the tail of the API's latency). Made with the right
 * prototypes, Express's own `setPrototypeOf` has nothing to change (V8 returns at once when
 * the prototype is already the one asked for) and a request's objects die young.
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
