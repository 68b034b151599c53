import { Migration } from '@mikro-orm/migrations';

/** Measured data files (Touchstone text) kept per workspace. */
export class Migration20261201233757_data_file extends Migration {
  override async up(): Promise<void> {
    this.addSql(
      `create table "data_file" ("id" uuid not null, "created_at" timestamptz not null, "updated_at" timestamptz not null, "workspace_id" uuid not null, "name" varchar(200) not null, "kind" text check ("kind" in ('s1p', 's2p')) not null, "content" text not null, "port_count" int not null, "point_count" int not null, "f_min_hz" double precision not null, "f_max_hz" double precision not null, "uploaded_by_id" uuid not null, constraint "data_file_pkey" primary key ("id"));`,
    );
    this.addSql(`create index "data_file_workspace_id_index" on "data_file" ("workspace_id");`);

    this.addSql(
      `alter table "data_file" add constraint "data_file_workspace_id_foreign" foreign key ("workspace_id") references "workspace" ("id") on update cascade on delete cascade;`,
    );
    this.addSql(
      `alter table "data_file" add constraint "data_file_uploaded_by_id_foreign" foreign key ("uploaded_by_id") references "app_user" ("id") on update cascade on delete restrict;`,
    );
  }

  override async down(): Promise<void> {
    this.addSql(`drop table if exists "data_file" cascade;`);
  }
}
