import type { Knex } from 'knex';
// knex.raw treats every ? as a binding: write {0,1} in a regex, never ?.

/**
 * Payments (issue #5, backend/src/payments): payment links, payments by card (through the processor) or by
 * cash / cheque / transfer (recorded by the bookkeeper), refunds, the processor's payouts and the webhook
 * events it sends.
 *
 * - payment_requests: a Checkout Session made for a contract's deposit or balance; at most one open link
 *   per contract and kind (a new link cancels the old one).
 * - payments: money received. Every processor id (payment intent, charge, balance transaction) is unique, so
 *   a charge is recorded once, whichever event reports it first. net = amount − fee; only a card has a fee.
 *   Each payment names the journal entry that posted it. Payments are never updated or deleted (a refund is
 *   its own row).
 * - refunds: money given back, each with the processor's refund id (unique) once it is made.
 * - processor_payouts: one row per processor payout (po_…). The processor account is the company's, so one
 *   payout can hold the charges of several branches: the payout row itself carries no branch; its
 *   per-branch portions are processor_payout_branches (gross, fee, net and the branch's own posting
 *   bank / clearing), and its balance transactions are processor_payout_items, each with its branch.
 *   Item amounts keep the processor's sign (a refund is negative), as in its balance transactions.
 * - webhook_events: each processor event id once (unique). The row is written in the same transaction as
 *   the event's processing, with processed_at set; a failed attempt rolls it back and is then noted apart
 *   (processed_at null, attempts, last_error) so that the retry processes it. An event has no branch of its
 *   own (it arrives before anyone knows which branch it concerns, and a payout concerns several): the
 *   records it produces carry theirs.
 * - lead_activities gets a 'payment' kind for the lead's timeline.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    alter table lead_activities drop constraint lead_activities_kind_check;
    alter table lead_activities add constraint lead_activities_kind_check check (kind in ('call', 'visit', 'note',
      'email', 'stage_change', 'transfer', 'assignment', 'inspection', 'proposal', 'approval', 'contract',
      'cancellation', 'job', 'payment'));

    create table payment_requests (
      id uuid primary key default gen_random_uuid(),
      contract_id uuid not null references contracts(id),
      branch_id uuid not null references branches(id),
      kind text not null check (kind in ('deposit', 'balance')),
      amount numeric(14,2) not null check (amount > 0),
      currency text not null default 'usd' check (currency ~ '^[a-z]{3}$'),
      checkout_session_id text not null unique check (length(checkout_session_id) between 1 and 255),
      url text not null check (length(url) between 1 and 2000),
      status text not null default 'open' check (status in ('open', 'paid', 'expired', 'cancelled')),
      expires_at timestamptz,
      emailed_to text check (length(emailed_to) <= 254),
      emailed_at timestamptz,
      email_count integer not null default 0 check (email_count >= 0),
      created_by uuid references users(id),
      created_at timestamptz not null default now(),
      paid_at timestamptz,
      check ((status = 'paid') = (paid_at is not null))
    );
    create index payment_requests_contract_idx on payment_requests (contract_id, created_at);
    create unique index payment_requests_one_open_idx on payment_requests (contract_id, kind) where status = 'open';

    create table payments (
      id uuid primary key default gen_random_uuid(),
      contract_id uuid not null references contracts(id),
      branch_id uuid not null references branches(id),
      payment_request_id uuid references payment_requests(id),
      kind text not null check (kind in ('deposit', 'balance')),
      method text not null check (method in ('card', 'cash', 'cheque', 'transfer')),
      amount numeric(14,2) not null check (amount > 0),
      fee numeric(14,2) not null default 0 check (fee >= 0 and fee <= amount),
      net numeric(14,2) not null,
      currency text not null default 'usd' check (currency ~ '^[a-z]{3}$'),
      processor_payment_intent_id text unique,
      processor_charge_id text unique,
      processor_balance_transaction_id text unique,
      card_brand text check (length(card_brand) <= 40),
      card_last4 text check (card_last4 ~ '^[0-9]{4}$'),
      reference text check (length(reference) <= 120),
      received_on date not null,
      recorded_by uuid references users(id),
      -- the request id of a user's recording (a repeated request records nothing twice)
      request_key text unique check (length(request_key) between 1 and 255),
      journal_entry_id uuid not null unique references journal_entries(id),
      created_at timestamptz not null default now(),
      check (net = amount - fee),
      check ((method = 'card') = (processor_charge_id is not null)),
      check (method = 'card' or fee = 0),
      check (method = 'card' or recorded_by is not null)
    );
    create index payments_contract_idx on payments (contract_id, received_on);
    create index payments_branch_idx on payments (branch_id, received_on);
    create index payments_received_idx on payments (received_on);

    create table refunds (
      id uuid primary key default gen_random_uuid(),
      contract_id uuid not null references contracts(id),
      branch_id uuid not null references branches(id),
      payment_id uuid not null references payments(id),
      amount numeric(14,2) not null check (amount > 0),
      currency text not null default 'usd' check (currency ~ '^[a-z]{3}$'),
      processor_refund_id text unique,
      processor_balance_transaction_id text unique,
      status text not null check (status in ('pending', 'succeeded', 'failed')),
      reason text check (length(reason) <= 500),
      requested_by uuid references users(id),
      refunded_on date not null,
      journal_entry_id uuid unique references journal_entries(id),
      created_at timestamptz not null default now(),
      check (status <> 'succeeded' or journal_entry_id is not null)
    );
    create index refunds_contract_idx on refunds (contract_id, created_at);
    create index refunds_branch_idx on refunds (branch_id, refunded_on);

    -- Money recorded stays recorded.
    create function payments_refuse_change() returns trigger language plpgsql as $$
    begin
      raise exception 'recorded payments are never changed or deleted: record a refund'
        using errcode = 'restrict_violation';
    end $$;
    create trigger payments_frozen before update or delete on payments
      for each row execute function payments_refuse_change();
    create function refunds_amount_frozen() returns trigger language plpgsql as $$
    begin
      if tg_op = 'DELETE' or (new.amount, new.payment_id, new.contract_id, new.branch_id)
         is distinct from (old.amount, old.payment_id, old.contract_id, old.branch_id)
         or (old.journal_entry_id is not null and new.journal_entry_id is distinct from old.journal_entry_id) then
        raise exception 'a refund keeps its amount, payment and posting' using errcode = 'restrict_violation';
      end if;
      return new;
    end $$;
    create trigger refunds_frozen before update or delete on refunds
      for each row execute function refunds_amount_frozen();

    create table processor_payouts (
      id uuid primary key default gen_random_uuid(),
      processor_payout_id text not null unique check (length(processor_payout_id) between 1 and 255),
      amount numeric(14,2) not null check (amount > 0),
      currency text not null check (currency ~ '^[a-z]{3}$'),
      arrival_date date not null,
      status text not null check (length(status) between 1 and 40),
      processor_balance_transaction_id text unique,
      processor_created_at timestamptz not null,
      created_at timestamptz not null default now()
    );
    create index processor_payouts_arrival_idx on processor_payouts (arrival_date);

    create table processor_payout_branches (
      payout_id uuid not null references processor_payouts(id),
      branch_id uuid not null references branches(id),
      gross numeric(14,2) not null,
      fee numeric(14,2) not null check (fee >= 0),
      net numeric(14,2) not null,
      item_count integer not null check (item_count > 0),
      journal_entry_id uuid unique references journal_entries(id),
      primary key (payout_id, branch_id),
      check (net = gross - fee),
      check ((net = 0) = (journal_entry_id is null))
    );
    create index processor_payout_branches_branch_idx on processor_payout_branches (branch_id);

    create table processor_payout_items (
      id uuid primary key default gen_random_uuid(),
      payout_id uuid not null references processor_payouts(id),
      processor_balance_transaction_id text not null unique
        check (length(processor_balance_transaction_id) between 1 and 255),
      type text not null check (length(type) between 1 and 40),
      source_id text check (length(source_id) <= 255),
      amount numeric(14,2) not null check (amount <> 0),
      fee numeric(14,2) not null check (fee >= 0),
      net numeric(14,2) not null,
      currency text not null check (currency ~ '^[a-z]{3}$'),
      branch_id uuid not null references branches(id),
      payment_id uuid references payments(id),
      refund_id uuid references refunds(id),
      check (net = amount - fee),
      check (type <> 'charge' or (amount > 0 and payment_id is not null)),
      check (type <> 'refund' or (amount < 0 and refund_id is not null))
    );
    create index processor_payout_items_payout_idx on processor_payout_items (payout_id);
    create index processor_payout_items_branch_idx on processor_payout_items (branch_id, payout_id);

    create table webhook_events (
      id uuid primary key default gen_random_uuid(),
      event_id text not null unique check (length(event_id) between 1 and 255),
      type text not null check (length(type) between 1 and 100),
      api_version text,
      created timestamptz not null,
      received_at timestamptz not null default now(),
      processed_at timestamptz,
      outcome text check (outcome in ('processed', 'ignored')),
      attempts integer not null default 1 check (attempts >= 1),
      last_error text check (length(last_error) <= 2000),
      payload jsonb not null,
      check ((processed_at is null) = (outcome is null))
    );
    create index webhook_events_unprocessed_idx on webhook_events (received_at) where processed_at is null;
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`
    drop table webhook_events;
    drop table processor_payout_items;
    drop table processor_payout_branches;
    drop table processor_payouts;
    drop trigger refunds_frozen on refunds;
    drop function refunds_amount_frozen();
    drop table refunds;
    drop trigger payments_frozen on payments;
    drop function payments_refuse_change();
    drop table payments;
    drop table payment_requests;
    delete from lead_activities where kind = 'payment';
    alter table lead_activities drop constraint lead_activities_kind_check;
    alter table lead_activities add constraint lead_activities_kind_check check (kind in ('call', 'visit', 'note',
      'email', 'stage_change', 'transfer', 'assignment', 'inspection', 'proposal', 'approval', 'contract',
      'cancellation', 'job'));
  `);
}
