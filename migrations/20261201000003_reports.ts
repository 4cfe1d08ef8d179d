import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("reports", (t) => {
    t.text("id").primary();
    t.text("team_id").notNullable().references("teams.id").onDelete("CASCADE");
    // All versions of one report share a series id; version counts up on "refresh".
    t.text("series_id").notNullable();
    t.integer("version").notNullable();
    t.text("baseline_id").references("baselines.id").onDelete("SET NULL");
    t.text("title").notNullable();
    t.text("audience_note").notNullable().defaultTo("");
    // Frozen inputs, results, chosen classes/metrics, model levels: one validated JSON document.
    t.text("frozen").notNullable();
    t.text("engine_version").notNullable();
    t.integer("is_demo").notNullable().defaultTo(0);
    t.text("created_by").references("users.id").onDelete("SET NULL");
    t.integer("created_at").notNullable();
    t.unique(["series_id", "version"]);
    t.index(["team_id"]);
  });
  await knex.schema.createTable("share_links", (t) => {
    t.text("id").primary();
    t.text("report_id").notNullable().references("reports.id").onDelete("CASCADE");
    t.text("token_hash").notNullable().unique();
    t.text("created_by").references("users.id").onDelete("SET NULL");
    t.integer("created_at").notNullable();
    t.integer("expires_at").notNullable();
    t.integer("revoked_at");
    t.integer("last_used_at");
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists("share_links");
  await knex.schema.dropTableIfExists("reports");
}
