// knex.raw treats every ? as a binding: write {0,1} in a regex, never ?.
import type { Knex } from 'knex';

/**
 * Branches, people, memberships and single-use password links. Every business table added later
 * carries a branch_id that references branches(id).
 */
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    create table branches (
      id uuid primary key default gen_random_uuid(),
      code text not null unique check (code ~ '^[A-Z][A-Z0-9]{1,7}$'),
      name text not null check (length(name) between 2 and 80),
      address_line1 text not null check (length(address_line1) <= 120),
      city text not null check (length(city) <= 80),
      state char(2) not null check (state ~ '^[A-Z]{2}$'),
      postal_code text not null check (postal_code ~ '^[0-9]{5}(-[0-9]{4}){0,1}$'),
      phone text check (length(phone) <= 32),
      timezone text not null,
      margin_floor_pct numeric(5,2) not null check (margin_floor_pct between 0 and 100),
      discount_limit_salesperson_pct numeric(5,2) not null check (discount_limit_salesperson_pct between 0 and 100),
      discount_limit_manager_pct numeric(5,2) not null check (discount_limit_manager_pct between 0 and 100),
      sales_tax_treatment text not null check (sales_tax_treatment in ('materials_cost', 'invoice')),
      sales_tax_rate_pct numeric(6,3) not null default 0 check (sales_tax_rate_pct between 0 and 100),
      created_at timestamptz not null default now(),
      updated_at timestamptz not null default now(),
      constraint discount_limits_ordered check (discount_limit_manager_pct >= discount_limit_salesperson_pct)
    );

    create table users (
      id uuid primary key default gen_random_uuid(),
      name text not null check (length(name) between 1 and 100),
      email text not null check (length(email) <= 254 and position('@' in email) > 1),
      password_hash text,
      role text not null check (role in ('owner', 'branch_manager', 'salesperson', 'bookkeeper', 'crew_lead')),
      active boolean not null default true,
      token_version integer not null default 0,
      invited_by uuid references users(id),
      last_sign_in_at timestamptz,
      created_at timestamptz not null default now(),
      updated_at timestamptz not null default now()
    );
    -- E-mail is unique whatever its case.
    create unique index users_email_lower_unique on users (lower(email));

    create table user_branches (
      user_id uuid not null references users(id),
      branch_id uuid not null references branches(id),
      primary key (user_id, branch_id)
    );
    create index user_branches_branch_idx on user_branches (branch_id);

    create table password_tokens (
      id uuid primary key default gen_random_uuid(),
      user_id uuid not null references users(id),
      token_hash text not null unique,
      purpose text not null check (purpose in ('invite', 'reset')),
      expires_at timestamptz not null,
      used_at timestamptz,
      superseded boolean not null default false,
      created_at timestamptz not null default now()
    );
    create index password_tokens_user_idx on password_tokens (user_id);

    -- People are deactivated, never deleted: their name stays on the records they touched.
    create function refuse_delete() returns trigger language plpgsql as $$
    begin
      raise exception '% rows are never deleted', tg_table_name using errcode = 'restrict_violation';
    end $$;
    create trigger users_never_deleted before delete on users for each row execute function refuse_delete();
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`
    drop table password_tokens;
    drop table user_branches;
    drop table users;
    drop function refuse_delete();
    drop table branches;
  `);
}
