import type { Knex } from 'knex';
// knex.raw treats every ? as a binding: write {0,1} in a regex, never ?.

/**
 * The job's core (issue #4, backend/src/jobs):
 * - the lead's timeline gets a 'job' kind for the job's events (scheduled, moved, started, permit, 811
 *   ticket, window waived);
 * - a job on a crew carries the crew's lead (the crew lead's permission rule reads jobs.crew_lead_id);
 * - a started job has its start time; a cancelled one its cancellation time;
 * - crews are listed per branch.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    alter table lead_activities drop constraint lead_activities_kind_check;
    alter table lead_activities add constraint lead_activities_kind_check check (kind in ('call', 'visit', 'note',
      'email', 'stage_change', 'transfer', 'assignment', 'inspection', 'proposal', 'approval', 'contract',
      'cancellation', 'job'));

    alter table jobs
      add constraint crew_has_lead check (crew_id is null or crew_lead_id is not null),
      add constraint started_has_time check (status not in ('in_progress', 'completed') or started_at is not null),
      add constraint cancelled_has_time check (status <> 'cancelled' or cancelled_at is not null),
      add constraint locate_expiry_after_filing check (locate_expires_on is null or locate_filed_on is null or
        locate_expires_on >= locate_filed_on);

    create index crews_branch_idx on crews (branch_id, name);
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`
    drop index crews_branch_idx;
    alter table jobs
      drop constraint locate_expiry_after_filing,
      drop constraint cancelled_has_time,
      drop constraint started_has_time,
      drop constraint crew_has_lead;
    alter table lead_activities drop constraint lead_activities_kind_check;
    alter table lead_activities add constraint lead_activities_kind_check check (kind in ('call', 'visit', 'note',
      'email', 'stage_change', 'transfer', 'assignment', 'inspection', 'proposal', 'approval', 'contract',
      'cancellation'));
  `);
}
