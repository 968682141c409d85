import type { Knex } from 'knex';
// knex.raw treats every ? as a binding: write {0,1} in a regex, never ?.

/**
 * Commissions (issue #5 §5): the owner's plans, each contract's split between salespeople, the lines
 * earned and clawed back, and the semi-monthly statements the bookkeeper approves and pays. The rules are
 * common/src/commissions; the database backs what must never go wrong:
 *
 * - commission_plans: basis, rate (flat or tiers, as JSON), the share earned at the first milestone, the
 *   day it applies from; branch_id null = the company-wide default, else that branch's plan. Once a split
 *   names a plan its terms (basis, rate, first milestone %, effective date, branch) never change — a new
 *   plan with a later effective date replaces it — so a commission is computed the same way at both
 *   milestones.
 * - contract_commission_splits: who shares a contract's commission and how much; the plan and the
 *   salesperson's volume earlier in the month are frozen when the split is set. The shares of a contract
 *   add up to exactly 100 and name one plan (a deferred constraint trigger, checked at commit, so a split
 *   can be replaced row by row in one transaction). Once a commission line exists for the contract, its
 *   split never changes.
 * - commission_lines: one row per contract, salesperson, milestone and kind, ever (the idempotency key,
 *   unique, is exactly those four); the amount is positive and the kind gives the sign; each line names
 *   the journal entry that posted it. Lines are never updated or deleted, except that a line not yet on a
 *   statement may be put on a draft statement of its salesperson and branch covering its date (or later).
 *   A clawback undoes exactly the earning of the same milestone.
 * - commission_statements: one per salesperson, branch and pay period (1st–15th, 16th–end); totals add up
 *   (net = carried in + earned − clawed back, payable = max(0, net)). An approved statement is locked: it
 *   may only be marked paid (once), and a paid one never changes.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    create table commission_plans (
      id uuid primary key default gen_random_uuid(),
      branch_id uuid references branches(id),
      name text not null check (length(name) between 1 and 80),
      basis text not null check (basis in ('net_price', 'gross_margin')),
      rate jsonb not null check (jsonb_typeof(rate) = 'object' and rate->>'kind' in ('flat', 'tiered')),
      first_milestone_pct numeric not null check (first_milestone_pct between 0 and 100),
      effective_from date not null,
      active boolean not null default true,
      created_by uuid references users(id),
      created_at timestamptz not null default now(),
      updated_at timestamptz not null default now()
    );
    -- One active plan per scope and start date: which plan applies to a contract is never a coin toss.
    create unique index commission_plans_scope_from_unique
      on commission_plans (coalesce(branch_id, '00000000-0000-0000-0000-000000000000'::uuid), effective_from)
      where active;

    create table contract_commission_splits (
      id uuid primary key default gen_random_uuid(),
      contract_id uuid not null references contracts(id),
      branch_id uuid not null references branches(id),
      salesperson_id uuid not null references users(id),
      position smallint not null check (position >= 0),
      share_pct numeric not null check (share_pct > 0 and share_pct <= 100),
      month_volume_before numeric(14,2) not null default 0 check (month_volume_before >= 0),
      plan_id uuid not null references commission_plans(id),
      set_by uuid references users(id),
      set_at timestamptz not null default now(),
      unique (contract_id, salesperson_id),
      unique (contract_id, position)
    );
    create index contract_commission_splits_salesperson_idx on contract_commission_splits (salesperson_id);
    create index contract_commission_splits_plan_idx on contract_commission_splits (plan_id);

    create function commission_plans_terms_frozen() returns trigger language plpgsql as $$
    begin
      if (new.branch_id, new.basis, new.rate, new.first_milestone_pct, new.effective_from)
         is distinct from (old.branch_id, old.basis, old.rate, old.first_milestone_pct, old.effective_from)
         and exists (select 1 from contract_commission_splits where plan_id = old.id) then
        raise exception 'commission plan % is in use: its terms cannot change; make a new plan', old.id
          using errcode = 'restrict_violation', constraint = 'commission_plans_in_use';
      end if;
      new.updated_at := now();
      return new;
    end $$;
    create trigger commission_plans_terms_frozen before update on commission_plans
      for each row execute function commission_plans_terms_frozen();

    -- At commit: the shares of the contract add up to exactly 100 (or there are none), all name one plan,
    -- and each row is in the contract's branch.
    create function contract_commission_splits_check() returns trigger language plpgsql as $$
    declare
      cid uuid := coalesce(new.contract_id, old.contract_id);
      n integer;
      total numeric;
      plans integer;
      stray integer;
    begin
      select count(*), coalesce(sum(s.share_pct), 0), count(distinct s.plan_id),
             count(*) filter (where s.branch_id <> c.branch_id)
        into n, total, plans, stray
        from contract_commission_splits s join contracts c on c.id = s.contract_id
       where s.contract_id = cid;
      if n > 0 and total <> 100 then
        raise exception 'the commission shares of contract % add up to %, not 100', cid, total
          using errcode = 'check_violation', constraint = 'contract_commission_splits_sum_100';
      end if;
      if plans > 1 then
        raise exception 'the commission split of contract % names more than one plan', cid
          using errcode = 'check_violation', constraint = 'contract_commission_splits_one_plan';
      end if;
      if stray > 0 then
        raise exception 'a commission split of contract % is outside its branch', cid
          using errcode = 'check_violation', constraint = 'contract_commission_splits_branch';
      end if;
      return null;
    end $$;
    create function contract_commission_splits_kept() returns trigger language plpgsql as $$
    begin
      if exists (select 1 from commission_lines
                  where contract_id = coalesce(new.contract_id, old.contract_id)) then
        raise exception 'a commission has been earned on contract %: its split is kept',
          coalesce(new.contract_id, old.contract_id)
          using errcode = 'restrict_violation', constraint = 'contract_commission_splits_earned';
      end if;
      return coalesce(new, old);
    end $$;

    create constraint trigger contract_commission_splits_sum_100
      after insert or update or delete on contract_commission_splits
      deferrable initially deferred for each row execute function contract_commission_splits_check();

    create table commission_statements (
      id uuid primary key default gen_random_uuid(),
      branch_id uuid not null references branches(id),
      salesperson_id uuid not null references users(id),
      period_start date not null,
      period_end date not null,
      status text not null default 'draft' check (status in ('draft', 'approved', 'paid')),
      earned numeric(14,2) not null default 0 check (earned >= 0),
      clawed_back numeric(14,2) not null default 0 check (clawed_back >= 0),
      carried_in numeric(14,2) not null default 0 check (carried_in <= 0),
      net numeric(14,2) not null default 0,
      payable numeric(14,2) not null default 0 check (payable >= 0),
      approved_by uuid references users(id),
      approved_at timestamptz,
      paid_by uuid references users(id),
      paid_at timestamptz,
      paid_on date,
      paid_reference text check (length(paid_reference) <= 120),
      paid_journal_entry_id uuid unique references journal_entries(id),
      created_at timestamptz not null default now(),
      updated_at timestamptz not null default now(),
      unique (salesperson_id, branch_id, period_start),
      -- the target of the lines' (statement, salesperson, branch) foreign key
      unique (id, salesperson_id, branch_id),
      -- a semi-monthly pay period: the 1st–15th or the 16th–last day of one month
      constraint commission_statements_period check (
        (extract(day from period_start) = 1 and period_end = period_start + 14)
        or (extract(day from period_start) = 16
            and period_end = (date_trunc('month', period_start::timestamp) + interval '1 month - 1 day')::date)),
      constraint commission_statements_totals check (
        net = carried_in + earned - clawed_back and payable = greatest(net, 0)),
      constraint commission_statements_approved check (
        status = 'draft' or (approved_by is not null and approved_at is not null)),
      constraint commission_statements_paid check (
        (status = 'paid') = (paid_at is not null)
        and (status <> 'paid' or (paid_by is not null and paid_on is not null))),
      -- a statement that pays something names its posting (payable / bank); one that pays 0.00 has none
      constraint commission_statements_paid_entry check (
        (paid_journal_entry_id is not null) = (status = 'paid' and payable > 0))
    );
    create index commission_statements_branch_period_idx on commission_statements (branch_id, period_start);

    create table commission_lines (
      id uuid primary key default gen_random_uuid(),
      idempotency_key text not null unique,
      contract_id uuid not null references contracts(id),
      salesperson_id uuid not null references users(id),
      branch_id uuid not null references branches(id),
      milestone text not null check (milestone in ('deposit_cleared_window_closed', 'job_completed')),
      kind text not null check (kind in ('earning', 'clawback')),
      amount numeric(14,2) not null check (amount > 0),
      effective_on date not null,
      journal_entry_id uuid not null unique references journal_entries(id),
      statement_id uuid,
      created_at timestamptz not null default now(),
      -- exactly common/src/commissions commissionEventKey(): once per contract, salesperson, milestone, kind
      constraint commission_lines_key check (
        idempotency_key = contract_id::text || ':' || salesperson_id::text || ':' || milestone || ':' || kind),
      -- a line sits on a statement of its own salesperson and branch
      foreign key (statement_id, salesperson_id, branch_id)
        references commission_statements (id, salesperson_id, branch_id)
    );
    create index commission_lines_contract_idx on commission_lines (contract_id);
    create index commission_lines_unplaced_idx on commission_lines (branch_id, salesperson_id, effective_on)
      where statement_id is null;
    create index commission_lines_statement_idx on commission_lines (statement_id) where statement_id is not null;

    create function commission_lines_guard() returns trigger language plpgsql as $$
    declare
      earned numeric;
      st record;
    begin
      if tg_op = 'INSERT' then
        if new.statement_id is not null then
          raise exception 'a commission line is written first, then put on a statement'
            using errcode = 'check_violation', constraint = 'commission_lines_placed_later';
        end if;
        if exists (select 1 from contracts where id = new.contract_id and branch_id <> new.branch_id) then
          raise exception 'a commission line is in its contract''s branch'
            using errcode = 'check_violation', constraint = 'commission_lines_branch';
        end if;
        if new.kind = 'clawback' then
          select amount into earned from commission_lines
           where contract_id = new.contract_id and salesperson_id = new.salesperson_id
             and milestone = new.milestone and kind = 'earning';
          if earned is null or earned <> new.amount then
            raise exception 'a clawback undoes exactly the earning of its milestone (earned %, clawback %)',
              earned, new.amount using errcode = 'check_violation', constraint = 'commission_lines_clawback';
          end if;
        end if;
        return new;
      end if;
      if tg_op = 'DELETE' then
        raise exception 'commission lines are never deleted: a cancellation claws back with a new line'
          using errcode = 'restrict_violation';
      end if;
      -- UPDATE: only putting a line not yet placed on a statement.
      if (new.id, new.idempotency_key, new.contract_id, new.salesperson_id, new.branch_id, new.milestone,
          new.kind, new.amount, new.effective_on, new.journal_entry_id, new.created_at)
         is distinct from
         (old.id, old.idempotency_key, old.contract_id, old.salesperson_id, old.branch_id, old.milestone,
          old.kind, old.amount, old.effective_on, old.journal_entry_id, old.created_at)
         or old.statement_id is not null or new.statement_id is null then
        raise exception 'a commission line never changes; it is only put, once, on a statement'
          using errcode = 'restrict_violation';
      end if;
      select status, period_end into st from commission_statements where id = new.statement_id;
      if st.status <> 'draft' then
        raise exception 'statement % is %: it takes no more lines', new.statement_id, st.status
          using errcode = 'restrict_violation', constraint = 'commission_statements_locked';
      end if;
      if new.effective_on > st.period_end then
        raise exception 'a line dated % cannot go on a statement ending %', new.effective_on, st.period_end
          using errcode = 'check_violation', constraint = 'commission_lines_period';
      end if;
      return new;
    end $$;
    create trigger commission_lines_guard before insert or update or delete on commission_lines
      for each row execute function commission_lines_guard();
    create trigger contract_commission_splits_kept before insert or update or delete on contract_commission_splits
      for each row execute function contract_commission_splits_kept();
    create trigger commission_lines_no_truncate before truncate on commission_lines
      for each statement execute function ledger_refuse_change();

    -- Drafts are recomputed freely; approved is locked except for being paid once; paid never changes.
    create function commission_statements_guard() returns trigger language plpgsql as $$
    begin
      if tg_op = 'DELETE' then
        if old.status <> 'draft' then
          raise exception 'statement % is %: it is kept', old.id, old.status
            using errcode = 'restrict_violation', constraint = 'commission_statements_locked';
        end if;
        return old;
      end if;
      if (new.id, new.branch_id, new.salesperson_id, new.period_start, new.period_end, new.created_at)
         is distinct from (old.id, old.branch_id, old.salesperson_id, old.period_start, old.period_end, old.created_at) then
        raise exception 'a statement keeps its salesperson, branch and period' using errcode = 'restrict_violation';
      end if;
      if old.status = 'draft' then
        if new.status = 'paid' then
          raise exception 'a statement is approved before it is paid'
            using errcode = 'check_violation', constraint = 'commission_statements_order';
        end if;
      elsif old.status = 'approved' and new.status = 'paid' then
        if (new.earned, new.clawed_back, new.carried_in, new.net, new.payable, new.approved_by, new.approved_at)
           is distinct from
           (old.earned, old.clawed_back, old.carried_in, old.net, old.payable, old.approved_by, old.approved_at) then
          raise exception 'statement % is approved: its figures are locked', old.id
            using errcode = 'restrict_violation', constraint = 'commission_statements_locked';
        end if;
      else
        raise exception 'statement % is %: it is locked', old.id, old.status
          using errcode = 'restrict_violation', constraint = 'commission_statements_locked';
      end if;
      new.updated_at := now();
      return new;
    end $$;
    create trigger commission_statements_guard before update or delete on commission_statements
      for each row execute function commission_statements_guard();
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`
    drop table commission_lines;
    drop function commission_lines_guard();
    drop table commission_statements;
    drop function commission_statements_guard();
    drop table contract_commission_splits;
    drop function contract_commission_splits_kept();
    drop function contract_commission_splits_check();
    drop table commission_plans;
    drop function commission_plans_terms_frozen();
  `);
}
