import type { IncomingMessage, ServerResponse } from 'node:http';

/** A plain GET route served on the Slack receiver's port (e.g. /metrics from the delivery side). */
export interface ExtraRoute {
  path: string;
  handler: (request: IncomingMessage, response: ServerResponse) => void;
}

/** Liveness for load balancers and checks: the process answers HTTP. */
export function answerHealth(_request: IncomingMessage, response: ServerResponse): void {
  response.writeHead(200, { 'content-type': 'text/plain' }).end('ok\n');
}

export const healthRoute: ExtraRoute = { path: '/healthz', handler: answerHealth };

/** Bolt custom routes for the HTTP receiver. */
export function boltRoutes(routes: ExtraRoute[]): Array<{ path: string; method: string[]; handler: ExtraRoute['handler'] }> {
  return routes.map((route) => ({ path: route.path, method: ['GET', 'HEAD'], handler: route.handler }));
}

/** The same routes for the small server Socket Mode needs, which has no Bolt receiver. */
export function routeListener(routes: ExtraRoute[]): (request: IncomingMessage, response: ServerResponse) => void {
  return (request, response) => {
    const path = request.url?.split('?')[0];
    const route = routes.find((candidate) => candidate.path === path);
    if (!route || (request.method !== 'GET' && request.method !== 'HEAD')) {
      response.writeHead(404).end();
      return;
    }
    route.handler(request, response);
  };
}
