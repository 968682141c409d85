// The fake's memory: every object by id, in creation order, and the list and expand rules of the API.
import { ApiError, invalid, noSuch } from './errors';
import { optInteger, optObject, type Params } from './params';
import type {
  ApiObject,
  BalanceTransaction,
  Charge,
  CheckoutSession,
  FakeEvent,
  LineItem,
  ListObject,
  PaymentIntent,
  Payout,
  Refund,
} from './types';

export class FakeState {
  readonly checkoutSessions = new Map<string, CheckoutSession>();
  readonly lineItems = new Map<string, LineItem[]>();
  readonly paymentIntents = new Map<string, PaymentIntent>();
  readonly charges = new Map<string, Charge>();
  readonly balanceTransactions = new Map<string, BalanceTransaction>();
  readonly refunds = new Map<string, Refund>();
  readonly payouts = new Map<string, Payout>();
  readonly events = new Map<string, FakeEvent>();
  /** Balance transaction id → the payout that swept it (the payout's own transaction included). */
  readonly paidOutBy = new Map<string, string>();
  /** Idempotency-Key → the first answer, replayed for a repeat of the same request. */
  readonly idempotent = new Map<string, { fingerprint: string; status: number; body: string }>();

  clear(): void {
    for (const m of [
      this.checkoutSessions,
      this.lineItems,
      this.paymentIntents,
      this.charges,
      this.balanceTransactions,
      this.refunds,
      this.payouts,
      this.events,
      this.paidOutBy,
      this.idempotent,
    ])
      m.clear();
  }

  /** The table an id belongs to, by its prefix. */
  tableFor(id: string): { kind: string; map: Map<string, ApiObject> } | undefined {
    const tables: [string, string, Map<string, ApiObject>][] = [
      ['cs_', 'checkout.session', this.checkoutSessions],
      ['pi_', 'payment_intent', this.paymentIntents],
      ['ch_', 'charge', this.charges],
      ['txn_', 'balance_transaction', this.balanceTransactions],
      ['re_', 'refund', this.refunds],
      ['po_', 'payout', this.payouts],
      ['evt_', 'event', this.events],
    ];
    const found = tables.find(([prefix]) => id.startsWith(prefix));
    return found && { kind: found[1], map: found[2] };
  }

  find(id: string): ApiObject | undefined {
    return this.tableFor(id)?.map.get(id);
  }

  get<T extends ApiObject>(map: Map<string, T>, kind: string, id: string, param = 'id'): T {
    const found = map.get(id);
    if (!found) throw noSuch(kind, id, param);
    return found;
  }

  /**
   * A copy of the object with the expand[] paths replaced by the objects they name
   * ("payment_intent", "payment_intent.latest_charge.balance_transaction", "data.source" on a list).
   */
  expand<T>(value: T, paths: string[]): T {
    const copy = structuredClone(value) as unknown;
    for (const path of paths) {
      const parts = path.split('.');
      if (parts.length > 4) throw invalid('expand', `You cannot expand more than 4 levels of a property.`);
      this.expandPath(copy, parts, path);
    }
    return copy as T;
  }

  private expandPath(target: unknown, parts: string[], whole: string): void {
    if (target === null || typeof target !== 'object' || parts.length === 0) return;
    const obj = target as Record<string, unknown>;
    const [field, ...rest] = parts;
    if (obj.object === 'list' && field === 'data' && Array.isArray(obj.data)) {
      for (const item of obj.data) this.expandPath(item, rest, whole);
      return;
    }
    if (!(field in obj)) throw invalid('expand', `This property cannot be expanded (${whole}).`);
    let value = obj[field];
    if (typeof value === 'string') {
      const found = this.find(value);
      if (!found) throw invalid('expand', `This property cannot be expanded (${whole}).`);
      value = structuredClone(found);
      obj[field] = value;
    }
    this.expandPath(value, rest, whole);
  }

  /** Expanding line_items on a Checkout Session: they are not part of the object otherwise. */
  expandSession(session: CheckoutSession, paths: string[]): Record<string, unknown> {
    const withItems: Record<string, unknown> = { ...session };
    if (paths.some((p) => p === 'line_items' || p.startsWith('line_items.')))
      withItems.line_items = list(
        this.lineItems.get(session.id) ?? [],
        {},
        `/v1/checkout/sessions/${session.id}/line_items`,
        {
          newestFirst: false,
        },
      );
    return this.expand(
      withItems,
      paths.filter((p) => p !== 'line_items'),
    );
  }
}

/**
 * One page of a list, as the API pages it: newest first, `limit` 1–100 (default 10), `starting_after` /
 * `ending_before` an object id, `created` an exact time or a range { gt, gte, lt, lte }.
 */
export function list<T extends { id: string; created?: number }>(
  items: Iterable<T>,
  query: Params,
  url: string,
  options: { newestFirst?: boolean } = {},
): ListObject<T> {
  let all = [...items];
  if (options.newestFirst !== false) all.reverse();
  const limit = optInteger(query, 'limit') ?? 10;
  if (limit < 1 || limit > 100)
    throw invalid(
      'limit',
      'This value must be greater than or equal to 1 and less than or equal to 100.',
      'parameter_invalid_integer',
    );
  const created = query.created;
  if (created !== undefined) {
    const range = typeof created === 'string' ? { eq: created } : (optObject(query, 'created') ?? {});
    const bound = (k: string) => optInteger(range as Params, k, `created[${k}]`);
    const [eq, gt, gte, lt, lte] = ['eq', 'gt', 'gte', 'lt', 'lte'].map(bound);
    all = all.filter((o) => {
      const c = o.created ?? 0;
      return (
        (eq === undefined || c === eq) &&
        (gt === undefined || c > gt) &&
        (gte === undefined || c >= gte) &&
        (lt === undefined || c < lt) &&
        (lte === undefined || c <= lte)
      );
    });
  }
  const after = typeof query.starting_after === 'string' ? query.starting_after : undefined;
  const before = typeof query.ending_before === 'string' ? query.ending_before : undefined;
  let page: T[];
  let hasMore: boolean;
  if (before) {
    const i = all.findIndex((o) => o.id === before);
    if (i < 0)
      throw new ApiError(
        400,
        'invalid_request_error',
        `No such object: '${before}'`,
        'resource_missing',
        'ending_before',
      );
    const head = all.slice(0, i);
    page = head.slice(Math.max(0, head.length - limit));
    hasMore = head.length > limit;
  } else {
    let start = 0;
    if (after) {
      const i = all.findIndex((o) => o.id === after);
      if (i < 0)
        throw new ApiError(
          400,
          'invalid_request_error',
          `No such object: '${after}'`,
          'resource_missing',
          'starting_after',
        );
      start = i + 1;
    }
    page = all.slice(start, start + limit);
    hasMore = all.length > start + limit;
  }
  return { object: 'list', data: page, has_more: hasMore, url };
}
