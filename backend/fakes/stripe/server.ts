// The HTTP side: the processor's REST API under /v1 (form-encoded requests, JSON answers, a bearer
// secret key), the hosted payment page under /pay, and the fake's own controls under /_fake.
import type { IncomingMessage, ServerResponse } from 'node:http';
import qs from 'qs';
import { ApiError, invalid, noSuch } from './errors';
import { newId } from './ids';
import { messagePage, paymentPage, type CardForm } from './page';
import { expandPaths, optString, type Params } from './params';
import { NO_REQUEST, type Cause, type Processor } from './processor';
import { list, type FakeState } from './state';
import type { ApiObject, BalanceTransaction } from './types';

export interface Controls {
  payoutNow(): unknown;
  flushDeliveries(timeoutMs?: number): Promise<unknown>;
  configure(patch: Record<string, unknown>): unknown;
  config(): unknown;
  deliveries(eventId?: string): unknown;
  redeliver(eventIds?: string[]): unknown;
  reset(): Promise<void>;
}

interface Request {
  method: string;
  path: string;
  query: Params;
  body: Params;
  rawBody: string;
  headers: IncomingMessage['headers'];
  cause: Cause;
}

type Handler = (req: Request, match: RegExpExecArray) => unknown;

const MAX_BODY = 1024 * 1024;
const QS = { arrayLimit: 200, depth: 10, parameterLimit: 5000 };

function readBody(req: IncomingMessage): Promise<string> {
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = [];
    let size = 0;
    req.on('data', (c: Buffer) => {
      size += c.length;
      if (size > MAX_BODY) {
        reject(new ApiError(413, 'invalid_request_error', 'Request body too large.'));
        req.destroy();
      } else chunks.push(c);
    });
    req.on('end', () => resolve(Buffer.concat(chunks).toString('utf8')));
    req.on('error', reject);
  });
}

function isLoopback(address: string | undefined): boolean {
  return address === '127.0.0.1' || address === '::1' || address === '::ffff:127.0.0.1';
}

export function createHandler(
  processor: Processor,
  state: FakeState,
  controls: Controls,
  apiVersion: string,
) {
  const api: [string, RegExp, Handler][] = [];
  const route = (method: string, pattern: string, handler: Handler) =>
    api.push([method, new RegExp(`^${pattern.replace(/:\w+/g, '([^/]+)')}$`), handler]);

  const one =
    <T extends ApiObject>(map: Map<string, T>, kind: string) =>
    (req: Request, m: RegExpExecArray) =>
      state.expand(state.get(map, kind, decodeURIComponent(m[1])), expandPaths(req.query));
  const page = <T extends { id: string; created?: number }>(req: Request, items: Iterable<T>, url: string) =>
    state.expand(list(items, req.query, url), expandPaths(req.query));
  const where = <T>(items: Iterable<T>, keep: (item: T) => boolean) => [...items].filter(keep);

  route('POST', '/v1/checkout/sessions', (req) =>
    state.expandSession(processor.createCheckoutSession(req.body, req.cause), expandPaths(req.body)),
  );
  route('GET', '/v1/checkout/sessions', (req) => {
    const pi = optString(req.query, 'payment_intent');
    return page(
      req,
      where(state.checkoutSessions.values(), (s) => !pi || s.payment_intent === pi),
      '/v1/checkout/sessions',
    );
  });
  route('GET', '/v1/checkout/sessions/:id', (req, m) =>
    state.expandSession(processor.session(decodeURIComponent(m[1])), expandPaths(req.query)),
  );
  route('POST', '/v1/checkout/sessions/:id/expire', (req, m) =>
    state.expandSession(
      processor.expireCheckoutSession(decodeURIComponent(m[1]), req.cause),
      expandPaths(req.body),
    ),
  );
  route('GET', '/v1/checkout/sessions/:id/line_items', (req, m) => {
    const session = processor.session(decodeURIComponent(m[1]));
    return list(
      state.lineItems.get(session.id) ?? [],
      req.query,
      `/v1/checkout/sessions/${session.id}/line_items`,
      {
        newestFirst: false,
      },
    );
  });

  route('GET', '/v1/payment_intents', (req) =>
    page(req, state.paymentIntents.values(), '/v1/payment_intents'),
  );
  route('GET', '/v1/payment_intents/:id', one(state.paymentIntents, 'payment_intent'));

  route('GET', '/v1/charges', (req) => {
    const pi = optString(req.query, 'payment_intent');
    return page(
      req,
      where(state.charges.values(), (c) => !pi || c.payment_intent === pi),
      '/v1/charges',
    );
  });
  route('GET', '/v1/charges/:id', one(state.charges, 'charge'));

  route('GET', '/v1/balance', () => processor.balance());
  route('GET', '/v1/balance_transactions', (req) => {
    const payout = optString(req.query, 'payout');
    const type = optString(req.query, 'type');
    const source = optString(req.query, 'source');
    const currency = optString(req.query, 'currency');
    if (payout && !state.payouts.has(payout)) throw noSuch('payout', payout, 'payout');
    const keep = (t: BalanceTransaction) =>
      (!payout || state.paidOutBy.get(t.id) === payout) &&
      (!type || t.type === type) &&
      (!source || t.source === source) &&
      (!currency || t.currency === currency);
    return page(req, where(state.balanceTransactions.values(), keep), '/v1/balance_transactions');
  });
  route('GET', '/v1/balance_transactions/:id', one(state.balanceTransactions, 'balance_transaction'));

  route('POST', '/v1/refunds', (req) =>
    state.expand(processor.createRefund(req.body, req.cause), expandPaths(req.body)),
  );
  route('GET', '/v1/refunds', (req) => {
    const charge = optString(req.query, 'charge');
    const pi = optString(req.query, 'payment_intent');
    return page(
      req,
      where(
        state.refunds.values(),
        (r) => (!charge || r.charge === charge) && (!pi || r.payment_intent === pi),
      ),
      '/v1/refunds',
    );
  });
  route('GET', '/v1/refunds/:id', one(state.refunds, 'refund'));

  route('GET', '/v1/payouts', (req) => {
    const status = optString(req.query, 'status');
    return page(
      req,
      where(state.payouts.values(), (p) => !status || p.status === status),
      '/v1/payouts',
    );
  });
  route('GET', '/v1/payouts/:id', one(state.payouts, 'payout'));

  route('GET', '/v1/events', (req) => {
    const type = optString(req.query, 'type');
    const types = Array.isArray(req.query.types) ? req.query.types.map(String) : undefined;
    const matches = (t: string) => {
      if (type && !(type.endsWith('*') ? t.startsWith(type.slice(0, -1)) : t === type)) return false;
      return !types || types.includes(t);
    };
    return page(
      req,
      where(state.events.values(), (e) => matches(e.type)),
      '/v1/events',
    );
  });
  route('GET', '/v1/events/:id', one(state.events, 'event'));

  async function handleApi(http: IncomingMessage, res: ServerResponse, req: Request) {
    const auth = http.headers.authorization ?? '';
    // A bearer token, as the SDK sends it, or HTTP Basic with the key as the user name (curl -u sk_test_…:).
    const basic = /^Basic (\S+)$/.exec(auth)?.[1];
    const key =
      /^Bearer (\S+)$/.exec(auth)?.[1] ??
      (basic && Buffer.from(basic, 'base64').toString('utf8').split(':')[0]);
    if (!key)
      throw new ApiError(
        401,
        'invalid_request_error',
        'You did not provide an API key. Provide your secret key as a bearer token (Authorization: Bearer sk_test_…).',
      );
    if (!/^sk_test_\w+$/.test(key))
      throw new ApiError(
        401,
        'invalid_request_error',
        `Invalid API Key provided: ${key.slice(0, 8)}…; the local fake takes sk_test_ keys only.`,
        'api_key_invalid',
      );
    const idem = req.method === 'POST' ? (http.headers['idempotency-key'] as string | undefined) : undefined;
    req.cause = { requestId: req.cause.requestId, idempotencyKey: idem ?? null };
    const fingerprint = `${req.method} ${req.path} ${req.rawBody}`;
    if (idem) {
      const seen = state.idempotent.get(`${key} ${idem}`);
      if (seen) {
        if (seen.fingerprint !== fingerprint)
          throw new ApiError(
            400,
            'idempotency_error',
            `Keys for idempotent requests can only be used with the same parameters they were first used with.`,
          );
        res.setHeader('Idempotent-Replayed', 'true');
        return send(res, seen.status, seen.body);
      }
    }
    let status = 200;
    let body: string;
    try {
      const found = api.find(([m, re]) => m === req.method && re.test(req.path));
      if (!found) {
        const other = api.some(([, re]) => re.test(req.path));
        throw new ApiError(
          404,
          'invalid_request_error',
          other
            ? `Unrecognized request URL (${req.method}: ${req.path}). This path does not take ${req.method} in the local fake.`
            : `Unrecognized request URL (${req.method}: ${req.path}). The local fake does not serve it.`,
        );
      }
      const result = await found[2](req, found[1].exec(req.path)!);
      body = JSON.stringify(result, null, 2);
    } catch (err) {
      if (!(err instanceof ApiError)) throw err;
      status = err.status;
      body = JSON.stringify(err, null, 2);
    }
    // The first answer (success or a 4xx) is the answer for that key from then on.
    if (idem) state.idempotent.set(`${key} ${idem}`, { fingerprint, status, body });
    send(res, status, body);
  }

  function send(res: ServerResponse, status: number, body: string, type = 'application/json') {
    res.statusCode = status;
    res.setHeader('Content-Type', type.includes('charset') ? type : `${type}; charset=utf-8`);
    res.end(body);
  }

  function html(res: ServerResponse, status: number, body: string) {
    res.setHeader(
      'Content-Security-Policy',
      "default-src 'none'; style-src 'unsafe-inline'; base-uri 'none'; frame-ancestors 'none'",
    );
    res.setHeader('Cache-Control', 'no-store');
    send(res, status, body, 'text/html; charset=utf-8');
  }

  function hostedPage(res: ServerResponse, req: Request, sessionId: string) {
    const session = state.checkoutSessions.get(sessionId) && processor.session(sessionId);
    if (!session)
      return html(res, 404, messagePage('Payment page not found', 'There is no payment with this link.'));
    if (session.status === 'expired')
      return html(
        res,
        410,
        messagePage('This payment link has expired', 'Ask the sender for a new payment link.'),
      );
    if (session.status === 'complete')
      return html(
        res,
        200,
        messagePage('This payment is complete', 'Thank you: the payment has been received.', {
          href: session.success_url.replaceAll('{CHECKOUT_SESSION_ID}', session.id),
          text: 'Continue',
        }),
      );
    const items = state.lineItems.get(session.id) ?? [];
    if (req.method === 'GET') return html(res, 200, paymentPage(session, items));
    const form: Partial<CardForm> = {
      number: optString(req.body, 'number'),
      expiry: optString(req.body, 'expiry'),
      cvc: optString(req.body, 'cvc'),
      name: optString(req.body, 'name'),
    };
    const result = processor.pay(session.id, form, NO_REQUEST);
    if (result.outcome === 'invalid')
      return html(res, 400, paymentPage(session, items, { values: form, errors: result.errors }));
    if (result.outcome === 'declined')
      return html(res, 402, paymentPage(session, items, { values: form, declined: result.error.message }));
    res.statusCode = 303;
    res.setHeader('Location', session.success_url.replaceAll('{CHECKOUT_SESSION_ID}', session.id));
    res.end();
  }

  async function handleControl(res: ServerResponse, req: Request) {
    const body = req.body;
    const pay = /^\/_fake\/checkout\/([^/]+)\/pay$/.exec(req.path);
    let result: unknown;
    let status = 200;
    if (req.method === 'GET' && req.path === '/_fake/health') result = { ok: true };
    else if (req.method === 'POST' && req.path === '/_fake/payouts')
      result = { object: 'list', data: controls.payoutNow() };
    else if (req.method === 'POST' && req.path === '/_fake/deliver')
      result = await controls.flushDeliveries(
        typeof body.timeoutMs === 'number' ? body.timeoutMs : undefined,
      );
    else if (req.method === 'GET' && req.path === '/_fake/config') result = controls.config();
    else if (req.method === 'POST' && req.path === '/_fake/config') result = controls.configure(body);
    else if (req.method === 'GET' && req.path === '/_fake/deliveries')
      result = { data: controls.deliveries(optString(req.query, 'event')) };
    else if (req.method === 'POST' && req.path === '/_fake/redeliver')
      result = controls.redeliver(Array.isArray(body.eventIds) ? body.eventIds.map(String) : undefined);
    else if (req.method === 'POST' && req.path === '/_fake/reset') {
      await controls.reset();
      result = { ok: true };
    } else if (req.method === 'POST' && pay) {
      const card = body.card as unknown;
      const form: Partial<CardForm> =
        typeof card === 'object' && card !== null
          ? (card as Partial<CardForm>)
          : {
              number: typeof card === 'string' ? card : '',
              expiry:
                typeof body.expiry === 'string'
                  ? body.expiry
                  : `12 / ${new Date(processor.now() * 1000).getUTCFullYear() + 3}`,
              cvc: typeof body.cvc === 'string' ? body.cvc : '123',
              name: typeof body.name === 'string' ? body.name : 'Test Cardholder',
            };
      const r = processor.pay(decodeURIComponent(pay[1]), form, NO_REQUEST);
      if (r.outcome === 'invalid') {
        status = 400;
        result = { outcome: r.outcome, errors: r.errors };
      } else if (r.outcome === 'declined') {
        status = 402;
        result = {
          outcome: r.outcome,
          error: r.error,
          session: r.session,
          payment_intent: r.paymentIntent,
          charge: r.charge,
        };
      } else
        result = {
          outcome: r.outcome,
          session: r.session,
          payment_intent: r.paymentIntent,
          charge: r.charge,
          balance_transaction: r.balanceTransaction,
        };
    } else throw new ApiError(404, 'invalid_request_error', `No control endpoint ${req.method} ${req.path}.`);
    send(res, status, JSON.stringify(result, null, 2));
  }

  return async function handle(http: IncomingMessage, res: ServerResponse): Promise<void> {
    const requestId = newId('req', 14);
    res.setHeader('Request-Id', requestId);
    res.setHeader('Stripe-Version', apiVersion);
    try {
      const url = new URL(http.url ?? '/', 'http://127.0.0.1');
      const method = (http.method ?? 'GET').toUpperCase();
      const rawBody = method === 'GET' || method === 'HEAD' ? '' : await readBody(http);
      const isJson = (http.headers['content-type'] ?? '').includes('application/json');
      let body: Params = {};
      if (rawBody) {
        try {
          body = isJson ? (JSON.parse(rawBody) as Params) : (qs.parse(rawBody, QS) as Params);
        } catch {
          throw invalid('body', 'The request body is not valid JSON.');
        }
      }
      const req: Request = {
        method,
        path: url.pathname,
        query: qs.parse(url.search.slice(1), QS) as Params,
        body,
        rawBody,
        headers: http.headers,
        cause: { requestId, idempotencyKey: null },
      };
      if (req.path.startsWith('/v1/')) await handleApi(http, res, req);
      else if (req.path.startsWith('/_fake/')) {
        if (!isLoopback(http.socket.remoteAddress))
          throw new ApiError(403, 'invalid_request_error', 'The control endpoints answer on loopback only.');
        await handleControl(res, req);
      } else {
        const pay = /^\/pay\/([^/]+)$/.exec(req.path);
        if (pay && (method === 'GET' || method === 'POST')) hostedPage(res, req, decodeURIComponent(pay[1]));
        else if (req.path === '/' && method === 'GET')
          send(
            res,
            200,
            JSON.stringify({ service: 'local card processor fake', api: '/v1', controls: '/_fake' }),
          );
        else
          throw new ApiError(
            404,
            'invalid_request_error',
            `Unrecognized request URL (${method}: ${req.path}).`,
          );
      }
    } catch (err) {
      if (res.headersSent) return void res.end();
      if (err instanceof ApiError) send(res, err.status, JSON.stringify(err, null, 2));
      else {
        console.error('[stripe-fake]', err);
        send(
          res,
          500,
          JSON.stringify(new ApiError(500, 'api_error', 'The local fake failed on this request.'), null, 2),
        );
      }
    }
  };
}
