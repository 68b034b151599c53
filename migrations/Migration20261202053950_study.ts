import { Migration } from '@mikro-orm/migrations';

/** Studies (Monte Carlo, band, optimiser) of a chain, run by workers. */
export class Migration20261202053950_study extends Migration {
  override async up(): Promise<void> {
    this.addSql(
      `create table "study" ("id" uuid not null, "chain_id" uuid not null, "chain_version" int not null, "created_by_id" uuid not null, "kind" varchar(20) not null, "status" varchar(12) not null default 'queued', "spec" jsonb not null, "document" jsonb not null, "progress" jsonb null, "checkpoint" jsonb null, "result" jsonb null, "error" text null, "attempts" int not null default 0, "cancel_requested" boolean not null default false, "created_at" timestamptz not null, "started_at" timestamptz null, "finished_at" timestamptz null, "heartbeat_at" timestamptz null, constraint "study_pkey" primary key ("id"));`,
    );
    this.addSql(
      `create index "study_chain_id_created_at_index" on "study" ("chain_id", "created_at");`,
    );
    this.addSql(
      `create index "study_status_heartbeat_at_index" on "study" ("status", "heartbeat_at");`,
    );

    this.addSql(
      `alter table "study" add constraint "study_chain_id_foreign" foreign key ("chain_id") references "chain" ("id") on update cascade on delete cascade;`,
    );
    this.addSql(
      `alter table "study" add constraint "study_created_by_id_foreign" foreign key ("created_by_id") references "app_user" ("id") on update cascade on delete cascade;`,
    );
  }

  override async down(): Promise<void> {
    this.addSql(`drop table if exists "study" cascade;`);
  }
}
