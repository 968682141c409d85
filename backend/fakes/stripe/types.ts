// The objects the fake keeps, shaped like the processor's API objects (the fields the app reads, plus the
// usual companions). Amounts are integers in minor units; times are unix seconds.

export type Metadata = Record<string, string>;

export interface LineItem {
  id: string;
  object: 'item';
  amount_discount: number;
  amount_subtotal: number;
  amount_tax: number;
  amount_total: number;
  currency: string;
  description: string;
  price: {
    id: string;
    object: 'price';
    currency: string;
    unit_amount: number;
    product: string;
    type: 'one_time';
  };
  quantity: number;
}

export interface CheckoutSession {
  id: string;
  object: 'checkout.session';
  amount_subtotal: number;
  amount_total: number;
  cancel_url: string | null;
  client_reference_id: string | null;
  created: number;
  currency: string;
  customer_details: { email: string | null; name: string | null } | null;
  customer_email: string | null;
  expires_at: number;
  livemode: false;
  metadata: Metadata;
  mode: 'payment';
  payment_intent: string | null;
  payment_method_types: string[];
  payment_status: 'unpaid' | 'paid';
  status: 'open' | 'complete' | 'expired';
  success_url: string;
  url: string | null;
}

export interface PaymentError {
  type: 'card_error';
  code: string;
  decline_code?: string;
  message: string;
  charge?: string;
}

export interface PaymentIntent {
  id: string;
  object: 'payment_intent';
  amount: number;
  amount_capturable: number;
  amount_received: number;
  capture_method: 'automatic';
  client_secret: string;
  created: number;
  currency: string;
  description: string | null;
  last_payment_error: PaymentError | null;
  latest_charge: string | null;
  livemode: false;
  metadata: Metadata;
  payment_method_types: string[];
  receipt_email: string | null;
  status: 'requires_payment_method' | 'succeeded' | 'canceled';
}

export interface Charge {
  id: string;
  object: 'charge';
  amount: number;
  amount_captured: number;
  amount_refunded: number;
  balance_transaction: string | null;
  billing_details: { name: string | null; email: string | null };
  captured: boolean;
  created: number;
  currency: string;
  description: string | null;
  failure_code: string | null;
  failure_message: string | null;
  livemode: false;
  metadata: Metadata;
  outcome: {
    network_status: string;
    reason: string | null;
    seller_message: string;
    type: string;
  };
  paid: boolean;
  payment_intent: string;
  payment_method_details: {
    type: 'card';
    card: { brand: string; last4: string; exp_month: number; exp_year: number; funding: 'credit' };
  };
  receipt_email: string | null;
  refunded: boolean;
  status: 'succeeded' | 'failed';
}

export interface FeeDetail {
  amount: number;
  application: null;
  currency: string;
  description: string;
  type: 'stripe_fee';
}

export interface BalanceTransaction {
  id: string;
  object: 'balance_transaction';
  amount: number;
  available_on: number;
  created: number;
  currency: string;
  description: string | null;
  exchange_rate: null;
  fee: number;
  fee_details: FeeDetail[];
  net: number;
  reporting_category: 'charge' | 'refund' | 'payout';
  source: string;
  status: 'pending' | 'available';
  type: 'charge' | 'refund' | 'payout';
}

export interface Refund {
  id: string;
  object: 'refund';
  amount: number;
  balance_transaction: string;
  charge: string;
  created: number;
  currency: string;
  metadata: Metadata;
  payment_intent: string;
  reason: string | null;
  status: 'succeeded';
}

export interface Payout {
  id: string;
  object: 'payout';
  amount: number;
  arrival_date: number;
  automatic: boolean;
  balance_transaction: string;
  created: number;
  currency: string;
  description: string;
  destination: string;
  failure_code: null;
  failure_message: null;
  livemode: false;
  metadata: Metadata;
  method: 'standard';
  source_type: 'card';
  statement_descriptor: string | null;
  status: 'in_transit' | 'paid';
  type: 'bank_account';
}

export interface FakeEvent {
  id: string;
  object: 'event';
  api_version: string;
  created: number;
  data: { object: unknown };
  livemode: false;
  pending_webhooks: number;
  request: { id: string | null; idempotency_key: string | null };
  type: string;
}

export interface ApiObject {
  id: string;
  object: string;
  created?: number;
}

export interface ListObject<T> {
  object: 'list';
  data: T[];
  has_more: boolean;
  url: string;
}
