import type { Knex } from 'knex';
// knex.raw treats every ? as a binding: write {0,1} in a regex, never ?.

/**
 * Field jobs (issue #4): from a signed contract to a completed, warrantied job.
 *
 * - crews and crew_members: a crew lead (a user with the crew_lead role) and the people with them;
 * - jobs: one per signed contract, carrying the chosen option's scope as its plan (job_plan_lines, a copy);
 *   scheduled on a crew for a run of days; its cancellation-window waiver, permit and 811 ticket;
 * - install_entries: the crew's log, one row per injection point or pier, written once per client row id
 *   so that a phone resending after a lost signal never makes a second row;
 * - job_photos, job_day_notes (with labour hours), job_completions (checklist, homeowner's signature),
 *   job_survey_points (the re-survey), warranties.
 * contracts.deposit_received_at is set when the deposit is in (issue #5 posts it; a contract without a
 * deposit counts as received).
 */
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    alter table contracts add column deposit_received_at timestamptz;

    create table crews (
      id uuid primary key default gen_random_uuid(),
      branch_id uuid not null references branches(id),
      name text not null check (length(name) between 1 and 60),
      lead_user_id uuid not null references users(id),
      active boolean not null default true,
      created_at timestamptz not null default now(),
      updated_at timestamptz not null default now(),
      unique (branch_id, name)
    );
    create index crews_lead_idx on crews (lead_user_id);

    create table crew_members (
      id uuid primary key default gen_random_uuid(),
      crew_id uuid not null references crews(id) on delete cascade,
      branch_id uuid not null references branches(id),
      name text not null check (length(name) between 1 and 100),
      phone text check (length(phone) <= 32),
      position integer not null default 0
    );
    create index crew_members_crew_idx on crew_members (crew_id);

    create table jobs (
      id uuid primary key default gen_random_uuid(),
      contract_id uuid not null unique references contracts(id),
      lead_id uuid not null references leads(id),
      branch_id uuid not null references branches(id),
      salesperson_id uuid references users(id),
      number text not null unique check (length(number) between 3 and 24),
      status text not null default 'unscheduled' check (status in ('unscheduled', 'scheduled', 'in_progress',
        'completed', 'cancelled')),
      crew_id uuid references crews(id),
      -- The crew's lead when the job was put on the crew: what the crew lead's permission rule reads.
      crew_lead_id uuid references users(id),
      start_on date,
      duration_days integer not null default 1 check (duration_days between 1 and 30),
      -- 16 CFR 429.1: the default is to wait for the window to close; a bona fide emergency waiver
      -- (a separate, dated and signed statement by the buyer) is recorded here.
      window_waived_at timestamptz,
      window_waiver_note text check (length(window_waiver_note) <= 2000),
      window_waived_by uuid references users(id),
      -- Permit.
      permit_needed boolean,
      permit_applied_on date,
      permit_number text check (length(permit_number) <= 60),
      permit_issued_on date,
      permit_inspection_passed_on date,
      -- 811 locate ticket.
      locate_ticket_number text check (length(locate_ticket_number) <= 60),
      locate_filed_on date,
      locate_earliest_dig_on date,
      locate_expires_on date,
      -- Estimates the actuals are compared with (copied from the plan, editable by the manager).
      estimated_labour_hours numeric(8,2) check (estimated_labour_hours >= 0),
      labour_cost_per_hour numeric(14,2) check (labour_cost_per_hour >= 0),
      started_at timestamptz,
      completed_at timestamptz,
      cancelled_at timestamptz,
      created_at timestamptz not null default now(),
      updated_at timestamptz not null default now(),
      constraint scheduled_has_crew_and_day check (status in ('unscheduled', 'cancelled') or
        (crew_id is not null and start_on is not null)),
      constraint completed_has_time check (status <> 'completed' or completed_at is not null),
      constraint waiver_needs_note check (window_waived_at is null or window_waiver_note is not null),
      constraint permit_dates_ordered check (permit_issued_on is null or permit_applied_on is null or
        permit_issued_on >= permit_applied_on),
      constraint dig_after_filing check (locate_earliest_dig_on is null or locate_filed_on is null or
        locate_earliest_dig_on > locate_filed_on)
    );
    create index jobs_branch_start_idx on jobs (branch_id, start_on);
    create index jobs_crew_start_idx on jobs (crew_id, start_on);
    create index jobs_crew_lead_idx on jobs (crew_lead_id);
    create index jobs_salesperson_idx on jobs (salesperson_id);

    -- A copy of the signed option's lines: the job's plan. Never changes with the price book.
    create table job_plan_lines (
      id uuid primary key default gen_random_uuid(),
      job_id uuid not null references jobs(id) on delete cascade,
      branch_id uuid not null references branches(id),
      position integer not null,
      code text not null,
      description text not null,
      category text not null,
      unit text not null,
      quantity numeric(14,3) not null check (quantity > 0),
      unit_cost numeric(14,2) not null check (unit_cost >= 0),
      unit_price numeric(14,2) not null check (unit_price >= 0),
      unique (job_id, position)
    );

    create table install_entries (
      id uuid primary key default gen_random_uuid(),
      job_id uuid not null references jobs(id),
      branch_id uuid not null references branches(id),
      -- The phone's own id for the row: a resend after a lost signal finds the row already written.
      client_row_id uuid not null unique,
      kind text not null check (kind in ('injection', 'push_pier', 'helical_pile')),
      number integer not null check (number between 1 and 9999),
      location text check (length(location) <= 120),
      location_ft numeric(8,2) check (location_ft >= 0),
      depth_ft numeric(8,2) check (depth_ft >= 0 and depth_ft <= 200),
      -- Injection.
      pounds numeric(10,2) check (pounds >= 0),
      stop_reason text check (stop_reason in ('surface_return', 'lift_observed', 'planned_quantity', 'other')),
      -- Piers.
      final_pressure_psi numeric(10,2) check (final_pressure_psi >= 0),
      torque_ft_lb numeric(12,2) check (torque_ft_lb >= 0),
      shaft text,
      capacity_ultimate_lb numeric(14,2),
      capacity_allowable_lb numeric(14,2),
      design_load_lb numeric(14,2) check (design_load_lb >= 0),
      below_design_load boolean,
      note text check (length(note) <= 2000),
      logged_by uuid not null references users(id),
      logged_at timestamptz not null,
      created_at timestamptz not null default now(),
      unique (job_id, kind, number),
      constraint injection_fields check (kind <> 'injection' or (pounds is not null and stop_reason is not null)),
      constraint other_needs_note check (stop_reason is distinct from 'other' or length(trim(note)) > 0)
    );
    create index install_entries_job_idx on install_entries (job_id, kind, number);

    create table job_photos (
      id uuid primary key default gen_random_uuid(),
      job_id uuid not null references jobs(id),
      branch_id uuid not null references branches(id),
      install_entry_id uuid references install_entries(id),
      storage_key text not null unique,
      thumbnail_key text,
      content_type text not null check (content_type in ('image/jpeg', 'image/png', 'image/webp', 'image/heic')),
      size_bytes integer not null check (size_bytes between 1 and 15728640),
      caption text check (length(caption) <= 300),
      uploaded_by uuid not null references users(id),
      created_at timestamptz not null default now()
    );
    create index job_photos_job_idx on job_photos (job_id);

    create table job_day_notes (
      id uuid primary key default gen_random_uuid(),
      job_id uuid not null references jobs(id),
      branch_id uuid not null references branches(id),
      client_row_id uuid not null unique,
      work_date date not null,
      note text check (length(note) <= 4000),
      crew_size integer check (crew_size between 1 and 50),
      labour_hours numeric(8,2) not null default 0 check (labour_hours >= 0 and labour_hours <= 1000),
      written_by uuid not null references users(id),
      created_at timestamptz not null default now()
    );
    create index job_day_notes_job_idx on job_day_notes (job_id, work_date);

    create table job_completions (
      job_id uuid primary key references jobs(id),
      branch_id uuid not null references branches(id),
      checklist jsonb not null,
      homeowner_name text not null check (length(homeowner_name) between 1 and 120),
      signature_png bytea not null,
      signed_at timestamptz not null,
      signed_ip text,
      completed_by uuid not null references users(id),
      note text check (length(note) <= 4000)
    );

    create table job_survey_points (
      id uuid primary key default gen_random_uuid(),
      job_id uuid not null references jobs(id) on delete cascade,
      branch_id uuid not null references branches(id),
      position integer not null,
      label text not null check (length(label) between 1 and 16),
      x_ft numeric(8,2) not null,
      y_ft numeric(8,2) not null,
      elevation_in numeric(8,2) not null,
      is_reference boolean not null default false,
      unique (job_id, label),
      unique (job_id, position)
    );

    create table warranties (
      id uuid primary key default gen_random_uuid(),
      job_id uuid not null unique references jobs(id),
      branch_id uuid not null references branches(id),
      number text not null unique,
      term_years integer not null check (term_years between 1 and 99),
      covers text not null check (length(covers) between 1 and 4000),
      exclusions text check (length(exclusions) <= 4000),
      transferable boolean not null default false,
      issued_on date not null,
      pdf_key text,
      issued_by uuid not null references users(id),
      created_at timestamptz not null default now()
    );

    -- The log is a record: a written row is never edited or removed (a mistake is corrected with a note
    -- on the day; the office voids nothing silently).
    create function install_entries_frozen() returns trigger language plpgsql as $$
    begin
      raise exception 'an install log row cannot be changed or deleted' using errcode = 'restrict_violation';
    end $$;
    create trigger install_entries_no_update before update or delete on install_entries
      for each row execute function install_entries_frozen();

    -- A completed job's completion record is final.
    create trigger job_completions_no_update before update or delete on job_completions
      for each row execute function install_entries_frozen();

    -- Child rows carry their job's branch.
    create function job_child_branch_matches() returns trigger language plpgsql as $$
    begin
      if new.branch_id is distinct from (select branch_id from jobs where id = new.job_id) then
        raise exception 'a job''s records belong to the job''s branch' using errcode = 'check_violation';
      end if;
      return new;
    end $$;
    create trigger install_entries_branch before insert on install_entries
      for each row execute function job_child_branch_matches();
    create trigger job_photos_branch before insert on job_photos
      for each row execute function job_child_branch_matches();
    create trigger job_day_notes_branch before insert on job_day_notes
      for each row execute function job_child_branch_matches();
    create trigger job_plan_lines_branch before insert on job_plan_lines
      for each row execute function job_child_branch_matches();
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`
    drop table warranties, job_survey_points, job_completions, job_day_notes, job_photos, install_entries,
      job_plan_lines, jobs, crew_members, crews;
    drop function job_child_branch_matches();
    drop function install_entries_frozen();
    alter table contracts drop column deposit_received_at;
  `);
}
