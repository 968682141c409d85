import type { Knex } from 'knex';
// knex.raw treats every ? as a binding: write {0,1} in a regex, never ?.

/**
 * Selling: leads and their timeline, inspections with findings, the floor-elevation survey and photos,
 * the price book, proposals (versions → options → lines) with approval requests, signing links and
 * signed contracts. Every table carries branch_id. Money is numeric(14,2); quantities numeric(14,3).
 */
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    -- Trigram indexes make the pipeline's free-text search an index lookup (pg_trgm ships with PostgreSQL).
    create extension if not exists pg_trgm;

    create table leads (
      id uuid primary key default gen_random_uuid(),
      branch_id uuid not null references branches(id),
      salesperson_id uuid references users(id),
      homeowner_name text not null check (length(homeowner_name) between 1 and 120),
      phone_primary text check (length(phone_primary) <= 32),
      phone_secondary text check (length(phone_secondary) <= 32),
      email text check (length(email) <= 254),
      preferred_contact text not null default 'phone' check (preferred_contact in ('phone', 'text', 'email')),
      address_line1 text not null check (length(address_line1) between 3 and 120),
      city text not null check (length(city) <= 80),
      state char(2) not null check (state ~ '^[A-Z]{2}$'),
      postal_code text not null check (postal_code ~ '^[0-9]{5}(-[0-9]{4}){0,1}$'),
      year_built integer check (year_built between 1700 and 2100),
      foundation_type text check (foundation_type in ('slab', 'crawlspace', 'basement', 'pier_and_beam')),
      source text check (length(source) <= 80),
      notes text check (length(notes) <= 4000),
      stage text not null default 'new' check (stage in ('new', 'inspection_booked', 'inspected', 'proposal_sent',
        'contract_signed', 'deposit_received', 'scheduled', 'in_progress', 'completed', 'paid_in_full', 'lost',
        'cancelled')),
      stage_changed_at timestamptz not null default now(),
      lost_reason text check (length(lost_reason) <= 500),
      value numeric(14,2) not null default 0 check (value >= 0),
      -- Normalised keys for the possible-duplicate check.
      phone_key text generated always as (right(regexp_replace(coalesce(phone_primary, ''), '[^0-9]', '', 'g'), 10)) stored,
      email_key text generated always as (lower(email)) stored,
      address_key text generated always as (
        lower(regexp_replace(address_line1, '[^A-Za-z0-9]', '', 'g')) || ':' || left(postal_code, 5)) stored,
      search_text text generated always as (
        lower(homeowner_name || ' ' || address_line1 || ' ' || city || ' ' || coalesce(email, ''))) stored,
      created_by uuid references users(id),
      created_at timestamptz not null default now(),
      updated_at timestamptz not null default now(),
      constraint lost_needs_reason check (stage <> 'lost' or lost_reason is not null)
    );
    -- The pipeline: a page in the default order straight from an index, and per-stage totals from a
    -- covering index (index-only scans once autovacuum has visited the table).
    create index leads_branch_stage_changed_idx on leads (branch_id, stage_changed_at, id);
    create index leads_stage_changed_idx on leads (stage_changed_at, id);
    create index leads_branch_stage_value_idx on leads (branch_id, stage) include (value, created_at);
    create index leads_branch_value_idx on leads (branch_id, value desc, id);
    create index leads_stage_value_idx on leads (stage, value desc, id);
    create index leads_branch_created_idx on leads (branch_id, created_at desc);
    create index leads_search_trgm_idx on leads using gin (search_text gin_trgm_ops);
    create index leads_phone_trgm_idx on leads using gin (phone_key gin_trgm_ops);

    -- Per-stage counts and value, kept by a trigger, so the pipeline's totals never scan the leads.
    create table lead_stage_totals (
      branch_id uuid not null references branches(id),
      salesperson_key uuid not null,
      stage text not null,
      -- No CHECK here: PostgreSQL checks the proposed row of an upsert before it sees the conflict.
      lead_count bigint not null default 0,
      value_total numeric(16,2) not null default 0,
      primary key (branch_id, salesperson_key, stage)
    );
    create function lead_stage_totals_apply(b uuid, sp uuid, st text, n integer, v numeric) returns void
    language sql as $$
      insert into lead_stage_totals (branch_id, salesperson_key, stage, lead_count, value_total)
      values (b, coalesce(sp, '00000000-0000-0000-0000-000000000000'), st, n, n * v)
      on conflict (branch_id, salesperson_key, stage) do update
        set lead_count = lead_stage_totals.lead_count + excluded.lead_count,
            value_total = lead_stage_totals.value_total + excluded.value_total;
    $$;
    create function lead_stage_totals_track() returns trigger language plpgsql as $$
    begin
      if tg_op in ('UPDATE', 'DELETE') then
        perform lead_stage_totals_apply(old.branch_id, old.salesperson_id, old.stage, -1, old.value);
      end if;
      if tg_op in ('INSERT', 'UPDATE') then
        perform lead_stage_totals_apply(new.branch_id, new.salesperson_id, new.stage, 1, new.value);
      end if;
      return null;
    end $$;
    create trigger leads_stage_totals after insert or delete on leads
      for each row execute function lead_stage_totals_track();
    create trigger leads_stage_totals_update after update of branch_id, salesperson_id, stage, value on leads
      for each row when ((old.branch_id, old.salesperson_id, old.stage, old.value)
                         is distinct from (new.branch_id, new.salesperson_id, new.stage, new.value))
      execute function lead_stage_totals_track();
    create index leads_salesperson_idx on leads (salesperson_id, stage);
    create index leads_phone_key_idx on leads (phone_key) where phone_key <> '';
    create index leads_email_key_idx on leads (email_key) where email_key is not null;
    create index leads_address_key_idx on leads (address_key);

    create table lead_activities (
      id uuid primary key default gen_random_uuid(),
      lead_id uuid not null references leads(id),
      branch_id uuid not null references branches(id),
      kind text not null check (kind in ('call', 'visit', 'note', 'email', 'stage_change', 'transfer', 'assignment',
        'inspection', 'proposal', 'approval', 'contract', 'cancellation')),
      body text check (length(body) <= 4000),
      data jsonb not null default '{}',
      actor_id uuid references users(id),
      created_at timestamptz not null default now()
    );
    create index lead_activities_lead_idx on lead_activities (lead_id, created_at);

    -- A lead moved between branches; both branches' managers keep seeing its history.
    create table lead_transfers (
      id uuid primary key default gen_random_uuid(),
      lead_id uuid not null references leads(id),
      from_branch_id uuid not null references branches(id),
      to_branch_id uuid not null references branches(id),
      note text check (length(note) <= 1000),
      transferred_by uuid not null references users(id),
      created_at timestamptz not null default now(),
      check (from_branch_id <> to_branch_id)
    );
    create index lead_transfers_from_idx on lead_transfers (from_branch_id);
    create index lead_transfers_lead_idx on lead_transfers (lead_id);

    create table inspections (
      id uuid primary key default gen_random_uuid(),
      lead_id uuid not null references leads(id),
      branch_id uuid not null references branches(id),
      inspector_id uuid references users(id),
      scheduled_at timestamptz not null,
      duration_minutes integer not null default 90 check (duration_minutes between 15 and 600),
      status text not null default 'booked' check (status in ('booked', 'completed', 'cancelled')),
      -- The findings checklist: { interiorCracks: [{location, widthIn, kind}], doorsSticking: [...], ... }.
      findings jsonb not null default '{}',
      summary text check (length(summary) <= 4000),
      completed_at timestamptz,
      created_at timestamptz not null default now(),
      updated_at timestamptz not null default now(),
      constraint completed_has_time check (status <> 'completed' or completed_at is not null)
    );
    create index inspections_lead_idx on inspections (lead_id);
    create index inspections_branch_time_idx on inspections (branch_id, scheduled_at);

    -- Floor-elevation survey: points in feet, elevations in inches relative to the reference point.
    create table survey_points (
      id uuid primary key default gen_random_uuid(),
      inspection_id uuid not null references inspections(id) on delete cascade,
      branch_id uuid not null references branches(id),
      kind text not null default 'inspection' check (kind in ('inspection', 'completion')),
      position integer not null,
      label text not null check (length(label) between 1 and 16),
      x_ft numeric(8,2) not null,
      y_ft numeric(8,2) not null,
      elevation_in numeric(8,2) not null,
      is_reference boolean not null default false,
      unique (inspection_id, kind, label),
      unique (inspection_id, kind, position)
    );

    create table inspection_photos (
      id uuid primary key default gen_random_uuid(),
      inspection_id uuid not null references inspections(id),
      branch_id uuid not null references branches(id),
      storage_key text not null unique,
      thumbnail_key text,
      content_type text not null check (content_type in ('image/jpeg', 'image/png', 'image/webp', 'image/heic')),
      size_bytes integer not null check (size_bytes between 1 and 15728640),
      caption text check (length(caption) <= 300),
      uploaded_by uuid not null references users(id),
      created_at timestamptz not null default now()
    );
    create index inspection_photos_inspection_idx on inspection_photos (inspection_id);

    create table price_book_items (
      id uuid primary key default gen_random_uuid(),
      branch_id uuid not null references branches(id),
      code text not null check (code ~ '^[A-Z0-9][A-Z0-9-]{0,23}$'),
      description text not null check (length(description) between 2 and 200),
      category text not null check (category in ('soil_stabilisation', 'piers', 'helical_piles', 'drainage',
        'permits_engineering', 'mobilisation')),
      unit text not null check (unit in ('each', 'lb', 'linear_ft', 'point', 'hour', 'lump_sum')),
      unit_cost numeric(14,2) not null check (unit_cost >= 0),
      unit_price numeric(14,2) not null check (unit_price >= 0),
      active boolean not null default true,
      created_at timestamptz not null default now(),
      updated_at timestamptz not null default now(),
      unique (branch_id, code)
    );

    -- A proposal is one version; editing a sent version makes a new row that names its predecessor.
    create table proposals (
      id uuid primary key default gen_random_uuid(),
      lead_id uuid not null references leads(id),
      branch_id uuid not null references branches(id),
      inspection_id uuid references inspections(id),
      version integer not null check (version >= 1),
      previous_id uuid references proposals(id),
      status text not null default 'draft' check (status in ('draft', 'pending_approval', 'approved', 'refused',
        'sent', 'signed', 'superseded', 'declined')),
      salesperson_id uuid references users(id),
      notes text check (length(notes) <= 4000),
      sent_at timestamptz,
      created_by uuid not null references users(id),
      created_at timestamptz not null default now(),
      updated_at timestamptz not null default now(),
      unique (lead_id, version)
    );
    create index proposals_branch_status_idx on proposals (branch_id, status);

    create table proposal_options (
      id uuid primary key default gen_random_uuid(),
      proposal_id uuid not null references proposals(id) on delete cascade,
      branch_id uuid not null references branches(id),
      position integer not null,
      title text not null check (length(title) between 1 and 120),
      description text check (length(description) <= 2000),
      discount_kind text not null default 'none' check (discount_kind in ('none', 'percent', 'amount')),
      discount_value numeric(14,2) not null default 0 check (discount_value >= 0),
      -- Totals as computed in common/ (decimal.js) when the option was last saved; a copy, so a later
      -- price-book change never alters a proposal already made.
      cost_total numeric(14,2) not null default 0,
      list_total numeric(14,2) not null default 0,
      discount_total numeric(14,2) not null default 0,
      net_total numeric(14,2) not null default 0,
      tax_total numeric(14,2) not null default 0,
      gross_margin_pct numeric(7,2),
      unique (proposal_id, position)
    );

    create table proposal_lines (
      id uuid primary key default gen_random_uuid(),
      option_id uuid not null references proposal_options(id) on delete cascade,
      branch_id uuid not null references branches(id),
      position integer not null,
      price_book_item_id uuid references price_book_items(id),
      code text not null,
      description text not null check (length(description) <= 200),
      category text not null,
      unit text not null,
      quantity numeric(14,3) not null check (quantity > 0),
      unit_cost numeric(14,2) not null check (unit_cost >= 0),
      unit_price numeric(14,2) not null check (unit_price >= 0),
      quantity_source text not null default 'typed' check (length(quantity_source) <= 40),
      unique (option_id, position)
    );

    create table approval_requests (
      id uuid primary key default gen_random_uuid(),
      proposal_id uuid not null references proposals(id),
      lead_id uuid not null references leads(id),
      branch_id uuid not null references branches(id),
      requested_by uuid not null references users(id),
      reasons text[] not null,
      figures jsonb not null,
      status text not null default 'pending' check (status in ('pending', 'approved', 'refused', 'withdrawn')),
      decided_by uuid references users(id),
      decided_at timestamptz,
      decision_note text check (length(decision_note) <= 2000),
      created_at timestamptz not null default now(),
      constraint decided_fields check ((status in ('pending', 'withdrawn')) = (decided_at is null))
    );
    create index approval_requests_pending_idx on approval_requests (branch_id) where status = 'pending';
    create unique index approval_requests_one_pending on approval_requests (proposal_id) where status = 'pending';

    -- Unguessable, expiring links the homeowner opens to read and sign. Only the hash is kept.
    create table signing_links (
      id uuid primary key default gen_random_uuid(),
      proposal_id uuid not null references proposals(id),
      branch_id uuid not null references branches(id),
      token_hash text not null unique,
      sent_to text not null,
      expires_at timestamptz not null,
      used_at timestamptz,
      revoked_at timestamptz,
      created_at timestamptz not null default now()
    );

    create table contracts (
      id uuid primary key default gen_random_uuid(),
      proposal_id uuid not null unique references proposals(id),
      option_id uuid not null references proposal_options(id),
      lead_id uuid not null references leads(id),
      branch_id uuid not null references branches(id),
      salesperson_id uuid references users(id),
      price numeric(14,2) not null check (price > 0),
      tax numeric(14,2) not null default 0,
      signed_by_name text not null check (length(signed_by_name) between 1 and 120),
      signed_at timestamptz not null,
      signed_on date not null,
      signed_ip text,
      signed_user_agent text,
      signed_in_person boolean not null default false,
      signature_png bytea not null,
      cancellation_statement text not null,
      last_day_to_cancel date not null,
      notices jsonb not null default '[]',
      pdf_key text,
      cancelled_at timestamptz,
      cancelled_by_kind text check (cancelled_by_kind in ('homeowner', 'staff')),
      cancelled_by uuid references users(id),
      cancellation_note text check (length(cancellation_note) <= 2000),
      created_at timestamptz not null default now(),
      check (last_day_to_cancel >= signed_on),
      check ((cancelled_at is null) = (cancelled_by_kind is null))
    );
    create index contracts_branch_idx on contracts (branch_id, signed_at desc);

    -- Signed contracts are records: their terms never change. Only the cancellation fields and the
    -- stored PDF's key may be filled in later.
    create function contracts_terms_frozen() returns trigger language plpgsql as $$
    begin
      if (new.price, new.tax, new.option_id, new.signed_by_name, new.signed_at, new.signature_png,
          new.cancellation_statement, new.last_day_to_cancel, new.notices)
         is distinct from
         (old.price, old.tax, old.option_id, old.signed_by_name, old.signed_at, old.signature_png,
          old.cancellation_statement, old.last_day_to_cancel, old.notices) then
        raise exception 'the terms of a signed contract cannot change' using errcode = 'restrict_violation';
      end if;
      return new;
    end $$;
    create trigger contracts_terms_frozen before update on contracts
      for each row execute function contracts_terms_frozen();
    create trigger contracts_never_deleted before delete on contracts
      for each row execute function refuse_delete();
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`
    drop table contracts, signing_links, approval_requests, proposal_lines, proposal_options, proposals,
      price_book_items, inspection_photos, survey_points, inspections, lead_transfers, lead_activities, leads cascade;
    drop function contracts_terms_frozen();
    drop table lead_stage_totals;
    drop function lead_stage_totals_track();
    drop function lead_stage_totals_apply(uuid, uuid, text, integer, numeric);
  `);
}
