import type { Knex } from 'knex';
// knex.raw treats every ? as a binding: write {0,1} in a regex, never ?.

/**
 * The double-entry ledger (issue #5): a chart of accounts per branch, journal entries and their lines.
 *
 * The database enforces what matters, whoever writes:
 * - every entry balances (debits = credits), has at least two lines, and all its lines and their accounts
 *   are in the entry's branch: checked at commit by deferred constraint triggers, so that the entry and its
 *   lines can be inserted one after the other inside a transaction;
 * - lines are added only in the transaction that posted their entry (an old entry cannot grow new lines);
 * - a reversing entry names the entry it reverses (once only, same branch) and mirrors its lines exactly;
 * - posted entries and lines are never updated, deleted or truncated (restrict_violation): a correction
 *   is a new entry that reverses the old one.
 * - lines on commission accounts name the salesperson (the sub-ledger).
 *
 * The accounts are those of common/src/ledger/accounts.ts (CHART_OF_ACCOUNTS), written out here so that
 * this migration never changes once shipped; test/ledger.e2e-spec.ts checks the two lists agree. A trigger
 * opens them for each new branch.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    -- A branch nobody has used yet may still be deleted (BranchesService.delete): its accounts go with it.
    -- Once a line names an account, the lines' foreign key keeps the account, and so the branch.
    create table ledger_accounts (
      id uuid primary key default gen_random_uuid(),
      branch_id uuid not null references branches(id) on delete cascade,
      code text not null check (code ~ '^[0-9]{4}$'),
      name text not null check (length(name) between 2 and 80),
      type text not null check (type in ('asset', 'liability', 'equity', 'revenue', 'expense')),
      normal_side text not null check (normal_side in ('debit', 'credit')),
      salesperson_subledger boolean not null default false,
      created_at timestamptz not null default now(),
      unique (branch_id, code),
      -- the target of the lines' (account_id, branch_id) foreign key: an account of the line's branch
      unique (id, branch_id)
    );

    create function ledger_open_accounts(b uuid) returns void language sql as $$
      insert into ledger_accounts (branch_id, code, name, type, normal_side, salesperson_subledger)
      select b, c.code, c.name, c.type, c.normal_side, c.sub
      from (values
        ('1010', 'Bank — operating account', 'asset', 'debit', false),
        ('1050', 'Card processor clearing', 'asset', 'debit', false),
        ('1200', 'Accounts receivable', 'asset', 'debit', false),
        ('2100', 'Customer deposits (contract liability)', 'liability', 'credit', false),
        ('2300', 'Commissions payable', 'liability', 'credit', true),
        ('3000', 'Owner’s equity — opening balances', 'equity', 'credit', false),
        ('4000', 'Contract revenue', 'revenue', 'credit', false),
        ('4900', 'Refunds and allowances', 'revenue', 'debit', false),
        ('5100', 'Card processing fees', 'expense', 'debit', false),
        ('5200', 'Commission expense', 'expense', 'debit', true)
      ) as c(code, name, type, normal_side, sub)
      on conflict (branch_id, code) do nothing;
    $$;

    create function branches_open_ledger() returns trigger language plpgsql as $$
    begin
      perform ledger_open_accounts(new.id);
      return null;
    end $$;
    create trigger branches_open_ledger after insert on branches
      for each row execute function branches_open_ledger();
    select ledger_open_accounts(id) from branches;

    -- An account keeps its meaning: only its name may change, and it is deleted only with its branch.
    create function ledger_accounts_frozen() returns trigger language plpgsql as $$
    begin
      if (new.branch_id, new.code, new.type, new.normal_side, new.salesperson_subledger)
         is distinct from (old.branch_id, old.code, old.type, old.normal_side, old.salesperson_subledger) then
        raise exception 'a ledger account keeps its branch, code, type and side' using errcode = 'restrict_violation';
      end if;
      return new;
    end $$;
    create trigger ledger_accounts_frozen before update on ledger_accounts
      for each row execute function ledger_accounts_frozen();
    create function ledger_accounts_kept() returns trigger language plpgsql as $$
    begin
      if exists (select 1 from branches where id = old.branch_id) then
        raise exception 'ledger accounts are deleted only with their branch' using errcode = 'restrict_violation';
      end if;
      return old;
    end $$;
    create trigger ledger_accounts_kept before delete on ledger_accounts
      for each row execute function ledger_accounts_kept();

    create table journal_entries (
      id uuid primary key default gen_random_uuid(),
      branch_id uuid not null references branches(id),
      reason_code text not null check (reason_code ~ '^[a-z][a-z_]*([.][a-z_]+)*$' and length(reason_code) <= 64),
      source_kind text not null check (source_kind in ('event', 'user', 'system')),
      source_ref text not null check (length(source_ref) between 1 and 255),
      idempotency_key text not null unique check (length(idempotency_key) between 1 and 255),
      reverses_entry_id uuid unique,
      memo text check (length(memo) <= 500),
      effective_on date not null,
      posted_at timestamptz not null default now(),
      posted_by uuid references users(id),
      -- the transaction that posted the entry (set by a trigger): lines may join it only in that one
      posted_txid xid8 not null default pg_current_xact_id(),
      lead_id uuid references leads(id),
      contract_id uuid references contracts(id),
      job_id uuid references jobs(id),
      unique (id, branch_id),
      -- a reversal reverses an entry of its own branch, and only one reversal per entry (unique above)
      foreign key (reverses_entry_id, branch_id) references journal_entries (id, branch_id),
      check (reverses_entry_id is distinct from id),
      check ((reason_code = 'reversal') = (reverses_entry_id is not null)),
      check (source_kind <> 'user' or posted_by is not null)
    );
    create index journal_entries_branch_date_idx on journal_entries (branch_id, effective_on, posted_at);
    create index journal_entries_date_idx on journal_entries (effective_on, posted_at);
    create index journal_entries_contract_idx on journal_entries (contract_id) where contract_id is not null;
    create index journal_entries_lead_idx on journal_entries (lead_id) where lead_id is not null;
    create index journal_entries_job_idx on journal_entries (job_id) where job_id is not null;

    create table journal_lines (
      id uuid primary key default gen_random_uuid(),
      entry_id uuid not null,
      position smallint not null check (position >= 1),
      account_id uuid not null,
      branch_id uuid not null references branches(id),
      side text not null check (side in ('debit', 'credit')),
      amount numeric(14,2) not null check (amount > 0),
      salesperson_id uuid references users(id),
      unique (entry_id, position),
      -- the line's branch is its entry's, and its account is of that branch
      foreign key (entry_id, branch_id) references journal_entries (id, branch_id),
      foreign key (account_id, branch_id) references ledger_accounts (id, branch_id)
    );
    -- The account ledger and the trial balance read lines by account.
    create index journal_lines_account_idx on journal_lines (account_id, entry_id) include (side, amount);
    create index journal_lines_salesperson_idx on journal_lines (salesperson_id, account_id)
      where salesperson_id is not null;

    create function journal_entries_stamp() returns trigger language plpgsql as $$
    begin
      new.posted_txid := pg_current_xact_id();
      return new;
    end $$;
    create trigger journal_entries_stamp before insert on journal_entries
      for each row execute function journal_entries_stamp();

    create function journal_lines_guard() returns trigger language plpgsql as $$
    declare
      txid xid8;
      sub boolean;
    begin
      select posted_txid into txid from journal_entries where id = new.entry_id;
      if txid is distinct from pg_current_xact_id() then
        raise exception 'lines are added to a journal entry only when it is posted: post a new entry'
          using errcode = 'restrict_violation', constraint = 'journal_lines_with_entry';
      end if;
      select salesperson_subledger into sub from ledger_accounts where id = new.account_id;
      if sub and new.salesperson_id is null then
        raise exception 'a line on a commission account names the salesperson'
          using errcode = 'check_violation', constraint = 'journal_lines_salesperson';
      end if;
      return new;
    end $$;
    create trigger journal_lines_guard before insert on journal_lines
      for each row execute function journal_lines_guard();

    -- The balance check, run at commit for each entry posted and each line added.
    create function journal_entry_check(eid uuid) returns void language plpgsql as $$
    declare
      e record;
      n integer;
      d numeric;
      c numeric;
    begin
      select id, branch_id, reverses_entry_id into e from journal_entries where id = eid;
      if not found then
        return;
      end if;
      select count(*),
             coalesce(sum(amount) filter (where side = 'debit'), 0),
             coalesce(sum(amount) filter (where side = 'credit'), 0)
        into n, d, c
        from journal_lines where entry_id = eid;
      if n < 2 then
        raise exception 'journal entry % has % line(s): an entry needs at least two', eid, n
          using errcode = 'check_violation', constraint = 'journal_entry_balanced';
      end if;
      if d <> c then
        raise exception 'journal entry % does not balance: debits %, credits %', eid, d, c
          using errcode = 'check_violation', constraint = 'journal_entry_balanced';
      end if;
      if exists (select 1 from journal_lines l join ledger_accounts a on a.id = l.account_id
                 where l.entry_id = eid and (l.branch_id <> e.branch_id or a.branch_id <> e.branch_id)) then
        raise exception 'journal entry % has a line outside its branch', eid
          using errcode = 'check_violation', constraint = 'journal_entry_branch';
      end if;
      if e.reverses_entry_id is not null and exists (
        (select account_id, case side when 'debit' then 'credit' else 'debit' end, amount, salesperson_id
           from journal_lines where entry_id = e.reverses_entry_id
         except all
         select account_id, side, amount, salesperson_id from journal_lines where entry_id = eid)
        union all
        (select account_id, side, amount, salesperson_id from journal_lines where entry_id = eid
         except all
         select account_id, case side when 'debit' then 'credit' else 'debit' end, amount, salesperson_id
           from journal_lines where entry_id = e.reverses_entry_id)
      ) then
        raise exception 'journal entry % does not mirror the entry it reverses', eid
          using errcode = 'check_violation', constraint = 'journal_entry_reversal';
      end if;
    end $$;

    create function journal_entries_balanced() returns trigger language plpgsql as $$
    begin
      perform journal_entry_check(new.id);
      return null;
    end $$;
    create constraint trigger journal_entries_balanced after insert on journal_entries
      deferrable initially deferred for each row execute function journal_entries_balanced();

    create function journal_lines_balanced() returns trigger language plpgsql as $$
    begin
      perform journal_entry_check(new.entry_id);
      return null;
    end $$;
    create constraint trigger journal_lines_balanced after insert on journal_lines
      deferrable initially deferred for each row execute function journal_lines_balanced();

    -- Posted is posted.
    create function ledger_refuse_change() returns trigger language plpgsql as $$
    begin
      raise exception 'posted % are never changed or deleted: post a reversing entry', tg_table_name
        using errcode = 'restrict_violation';
    end $$;
    create trigger journal_entries_frozen before update or delete on journal_entries
      for each row execute function ledger_refuse_change();
    create trigger journal_lines_frozen before update or delete on journal_lines
      for each row execute function ledger_refuse_change();
    create trigger journal_entries_no_truncate before truncate on journal_entries
      for each statement execute function ledger_refuse_change();
    create trigger journal_lines_no_truncate before truncate on journal_lines
      for each statement execute function ledger_refuse_change();
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`
    drop table journal_lines;
    drop table journal_entries;
    drop function ledger_refuse_change();
    drop function journal_lines_balanced();
    drop function journal_entries_balanced();
    drop function journal_entry_check(uuid);
    drop function journal_lines_guard();
    drop function journal_entries_stamp();
    drop trigger branches_open_ledger on branches;
    drop function branches_open_ledger();
    drop table ledger_accounts;
    drop function ledger_accounts_kept();
    drop function ledger_accounts_frozen();
    drop function ledger_open_accounts(uuid);
  `);
}
