import type { Knex } from 'knex';
import * as foundation from '../../migrations/20261201000000_foundation';
import * as naming from '../../migrations/20261201010000_naming';
import * as mail from '../../migrations/20261201020000_mail';
import * as review from '../../migrations/20261201030000_review';
import * as jobs from '../../migrations/20261201040000_jobs';
import * as seatHeight from '../../migrations/20261205020000_seat_height';
import * as loadLists from '../../migrations/20261205030000_load_lists';
import * as jobPartRotation from '../../migrations/20261205040000_job_part_rotation';
import * as rateLimits from '../../migrations/20261205095000_rate_limits';
import * as partPrograms from '../../migrations/20261205080000_part_programs';
import * as sessions from '../../migrations/20261205120000_sessions';
import * as placementCount from '../../migrations/20261205120100_placement_count';
import * as readStamps from '../../migrations/20261206100000_read_stamps';
import * as jobBarDrafts from '../../migrations/20261208100000_job_bar_drafts';
import * as loadListTicks from '../../migrations/20261208400000_load_list_ticks';

// Migrations are imported statically so the same list runs under tsx, vitest and the bench
// scripts; knex's directory loader cannot import .ts files by itself.
const MIGRATIONS: Record<string, Knex.Migration> = {
  '20261201000000_foundation': foundation,
  '20261201010000_naming': naming,
  '20261201020000_mail': mail,
  '20261201030000_review': review,
  '20261201040000_jobs': jobs,
  '20261205020000_seat_height': seatHeight,
  '20261205030000_load_lists': loadLists,
  '20261205040000_job_part_rotation': jobPartRotation,
  '20261205080000_part_programs': partPrograms,
  '20261205095000_rate_limits': rateLimits,
  '20261205120000_sessions': sessions,
  '20261205120100_placement_count': placementCount,
  '20261206100000_read_stamps': readStamps,
  '20261208100000_job_bar_drafts': jobBarDrafts,
  '20261208400000_load_list_ticks': loadListTicks,
};

export const migrationSource: Knex.MigrationSource<string> = {
  getMigrations: async () => Object.keys(MIGRATIONS).sort(),
  getMigrationName: (name) => name,
  getMigration: async (name) => MIGRATIONS[name]!,
};
