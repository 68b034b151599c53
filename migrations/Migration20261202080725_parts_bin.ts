import { Migration } from '@mikro-orm/migrations';

/** The parts bin: a workspace's inductors and capacitors with Q, its frequency and tolerance. */
export class Migration20261202080725_parts_bin extends Migration {
  override async up(): Promise<void> {
    this.addSql(
      `create table "part" ("id" uuid not null, "created_at" timestamptz not null, "updated_at" timestamptz not null, "workspace_id" uuid not null, "part_number" varchar(100) not null, "kind" text check ("kind" in ('inductor', 'capacitor')) not null, "value" double precision not null, "q" double precision null, "q_freq_hz" double precision null, "tolerance_pct" double precision null, "notes" varchar(500) not null, "source_line" int not null, "uploaded_by_id" uuid not null, constraint "part_pkey" primary key ("id"));`,
    );
    this.addSql(`create index "part_workspace_id_index" on "part" ("workspace_id");`);

    this.addSql(
      `alter table "part" add constraint "part_workspace_id_foreign" foreign key ("workspace_id") references "workspace" ("id") on update cascade on delete cascade;`,
    );
    this.addSql(
      `alter table "part" add constraint "part_uploaded_by_id_foreign" foreign key ("uploaded_by_id") references "app_user" ("id") on update cascade on delete restrict;`,
    );
  }

  override async down(): Promise<void> {
    this.addSql(`drop table if exists "part" cascade;`);
  }
}
