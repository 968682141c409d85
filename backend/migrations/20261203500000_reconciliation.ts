import type { Knex } from 'knex';
// knex.raw treats every ? as a binding: write {0,1} in a regex, never ?.

/**
 * Reconciliation (issue #5 §6, backend/src/reconciliation): the company's bank accounts, the statements the
 * bookkeeper uploads as CSV, their lines, the matches between bank lines and what the books expect to see
 * on the bank (processor payouts, commission payments), and the periods reconciled and locked.
 *
 * - bank_accounts: branch_id is null for a company-wide account (the processor's payouts land in one account
 *   whatever branch the charges belong to). receives_payouts says whether processor payouts are looked for
 *   on it. csv_mapping is the column choice of the last upload, offered again on the next ("remember the
 *   choice per bank").
 * - bank_statements: one uploaded file. The SHA-256 of the file's bytes is unique per account: the same file
 *   is refused a second time. mapping is the column choice used; skipped_rows lists the rows the bookkeeper
 *   chose to leave out (with their errors).
 * - bank_lines: one per transaction row, signed (positive = money into the account), in dollars and integer
 *   cents (the two agree). A line is what the bank printed: it is never updated.
 * - reconciliation_matches: a bank line matched to a payout, to a paid commission statement, or marked as
 *   "other" (reviewed: not something the books match, e.g. rent) with a note. One match per bank line and
 *   per payout / statement. The amounts agree to the cent (a commission payment is money out: the line is
 *   the negative of the statement's payable). A suggestion (status suggested, made by the matcher) becomes
 *   confirmed once; only that may change on a match.
 * - reconciled_periods: a bank account's dates locked once reconciled; periods of one account never overlap
 *   and a lock is never changed or removed.
 *
 * The database refuses (restrict_violation) any insert or delete of a bank line, and any insert, update or
 * delete of a match, whose bank line is dated inside a locked period of its account. Locking takes the bank
 * account row FOR UPDATE and every match change takes it FOR SHARE (in the trigger), so a lock and a change
 * of a match on the same account never interleave.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    create extension if not exists btree_gist;

    create table bank_accounts (
      id uuid primary key default gen_random_uuid(),
      branch_id uuid references branches(id),
      name text not null check (length(name) between 2 and 80),
      last4 text not null check (last4 ~ '^[0-9]{4}$'),
      receives_payouts boolean not null default true,
      csv_mapping jsonb check (csv_mapping is null or jsonb_typeof(csv_mapping) = 'object'),
      csv_mapping_updated_at timestamptz,
      created_by uuid not null references users(id),
      created_at timestamptz not null default now(),
      unique nulls not distinct (branch_id, name),
      check ((csv_mapping is null) = (csv_mapping_updated_at is null))
    );

    create table bank_statements (
      id uuid primary key default gen_random_uuid(),
      bank_account_id uuid not null references bank_accounts(id),
      file_name text not null check (length(file_name) between 1 and 255),
      file_sha256 text not null check (file_sha256 ~ '^[0-9a-f]{64}$'),
      file_bytes integer not null check (file_bytes > 0),
      period_from date not null,
      period_to date not null,
      -- records in the file (the header and blank rows counted) and transaction lines kept
      row_count integer not null check (row_count >= 1),
      line_count integer not null check (line_count >= 1),
      mapping jsonb not null check (jsonb_typeof(mapping) = 'object'),
      skipped_rows jsonb not null default '[]' check (jsonb_typeof(skipped_rows) = 'array'),
      uploaded_by uuid not null references users(id),
      uploaded_at timestamptz not null default now(),
      check (period_from <= period_to),
      check (line_count <= row_count),
      -- the same file once per account
      unique (bank_account_id, file_sha256),
      unique (id, bank_account_id)
    );
    create index bank_statements_account_idx on bank_statements (bank_account_id, period_from);

    create table bank_lines (
      id uuid primary key default gen_random_uuid(),
      statement_id uuid not null,
      bank_account_id uuid not null,
      row_number integer not null check (row_number >= 1),
      posted_on date not null,
      description text not null default '' check (length(description) <= 500),
      amount numeric(14,2) not null,
      amount_cents bigint not null,
      check (amount_cents = amount * 100),
      unique (statement_id, row_number),
      -- the line's account is its statement's
      foreign key (statement_id, bank_account_id) references bank_statements (id, bank_account_id)
    );
    create index bank_lines_account_date_idx on bank_lines (bank_account_id, posted_on) include (amount_cents);

    create table reconciled_periods (
      id uuid primary key default gen_random_uuid(),
      bank_account_id uuid not null references bank_accounts(id),
      period_start date not null,
      period_end date not null,
      locked_by uuid not null references users(id),
      locked_at timestamptz not null default now(),
      check (period_start <= period_end),
      constraint reconciled_periods_no_overlap
        exclude using gist (bank_account_id with =, daterange(period_start, period_end, '[]') with &&)
    );

    create table reconciliation_matches (
      id uuid primary key default gen_random_uuid(),
      bank_line_id uuid not null unique references bank_lines(id),
      target_kind text not null check (target_kind in ('payout', 'commission_payment', 'other')),
      payout_id uuid unique references processor_payouts(id),
      commission_statement_id uuid unique references commission_statements(id),
      target_id uuid generated always as (coalesce(payout_id, commission_statement_id)) stored,
      note text check (length(note) <= 300),
      amount_cents bigint not null,
      days_apart integer,
      status text not null check (status in ('suggested', 'confirmed')),
      created_by uuid not null references users(id),
      created_at timestamptz not null default now(),
      matched_by uuid references users(id),
      matched_at timestamptz,
      check ((target_kind = 'payout') = (payout_id is not null)),
      check ((target_kind = 'commission_payment') = (commission_statement_id is not null)),
      check (target_kind <> 'other' or (note is not null and length(btrim(note)) > 0 and status = 'confirmed')),
      check ((status = 'confirmed') = (matched_by is not null and matched_at is not null))
    );

    create function reconciliation_is_locked(account uuid, day date) returns boolean language sql stable as $$
      select exists (select 1 from reconciled_periods
                     where bank_account_id = account and day between period_start and period_end);
    $$;

    -- Bank lines: never updated; inserted or deleted only outside a locked period.
    create function bank_lines_guard() returns trigger language plpgsql as $$
    declare
      l record;
    begin
      if tg_op = 'UPDATE' then
        raise exception 'a bank line is what the bank printed: it is never changed'
          using errcode = 'restrict_violation', constraint = 'bank_lines_frozen';
      end if;
      l := case when tg_op = 'DELETE' then old else new end;
      perform 1 from bank_accounts where id = l.bank_account_id for share;
      if reconciliation_is_locked(l.bank_account_id, l.posted_on) then
        raise exception 'the bank line of % is inside a reconciled, locked period', l.posted_on
          using errcode = 'restrict_violation', constraint = 'reconciliation_period_locked';
      end if;
      return l;
    end $$;
    create trigger bank_lines_guard before insert or update or delete on bank_lines
      for each row execute function bank_lines_guard();

    -- Matches: amounts agree; only suggested → confirmed may change; nothing inside a locked period.
    create function reconciliation_matches_guard() returns trigger language plpgsql as $$
    declare
      m record;
      line record;
      expected bigint;
    begin
      m := case when tg_op = 'DELETE' then old else new end;
      if tg_op = 'UPDATE' then
        if (new.bank_line_id, new.target_kind, new.payout_id, new.commission_statement_id, new.note,
            new.amount_cents, new.days_apart, new.created_by, new.created_at)
           is distinct from
           (old.bank_line_id, old.target_kind, old.payout_id, old.commission_statement_id, old.note,
            old.amount_cents, old.days_apart, old.created_by, old.created_at)
           or not (old.status = 'suggested' and new.status = 'confirmed') then
          raise exception 'a match is only confirmed; undo it and match again to change it'
            using errcode = 'restrict_violation', constraint = 'reconciliation_matches_frozen';
        end if;
      end if;
      select bank_account_id, posted_on, amount_cents into line from bank_lines where id = m.bank_line_id;
      perform 1 from bank_accounts where id = line.bank_account_id for share;
      if reconciliation_is_locked(line.bank_account_id, line.posted_on) then
        raise exception 'the bank line of % is inside a reconciled, locked period', line.posted_on
          using errcode = 'restrict_violation', constraint = 'reconciliation_period_locked';
      end if;
      if tg_op = 'INSERT' then
        if new.amount_cents <> line.amount_cents then
          raise exception 'the match amount % is not the bank line''s %', new.amount_cents, line.amount_cents
            using errcode = 'check_violation', constraint = 'reconciliation_matches_amount';
        end if;
        if new.target_kind = 'payout' then
          select (amount * 100)::bigint into expected from processor_payouts where id = new.payout_id;
        elsif new.target_kind = 'commission_payment' then
          select -(payable * 100)::bigint into expected from commission_statements
            where id = new.commission_statement_id and status = 'paid';
        else
          expected := line.amount_cents;
        end if;
        if expected is distinct from line.amount_cents then
          raise exception 'the bank line (% cents) does not match the amount of its target (% cents)',
            line.amount_cents, expected
            using errcode = 'check_violation', constraint = 'reconciliation_matches_amount';
        end if;
      end if;
      return m;
    end $$;
    create trigger reconciliation_matches_guard before insert or update or delete on reconciliation_matches
      for each row execute function reconciliation_matches_guard();

    -- A lock stays.
    create function reconciled_periods_frozen() returns trigger language plpgsql as $$
    begin
      raise exception 'a reconciled period stays locked' using errcode = 'restrict_violation';
    end $$;
    create trigger reconciled_periods_frozen before update or delete on reconciled_periods
      for each row execute function reconciled_periods_frozen();
    create trigger reconciliation_no_truncate before truncate on reconciled_periods
      for each statement execute function reconciled_periods_frozen();
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`
    drop table reconciliation_matches;
    drop function reconciliation_matches_guard();
    drop table reconciled_periods;
    drop function reconciled_periods_frozen();
    drop table bank_lines;
    drop function bank_lines_guard();
    drop function reconciliation_is_locked(uuid, date);
    drop table bank_statements;
    drop table bank_accounts;
  `);
}
