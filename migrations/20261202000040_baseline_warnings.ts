import type { Knex } from "knex";

// Warnings an import returned (issue 13 item 2): kept on the baseline until someone dismisses them, so a warning the
// server answered is never lost to a redirect. `class_name` names the class a histogram warning is about (null: the
// whole baseline); a later histogram import of that class supersedes it (dismissed with `dismissed_by` = the importer).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("baseline_warnings", (t) => {
    t.text("id").primary();
    t.text("baseline_id").notNullable().references("id").inTable("baselines").onDelete("CASCADE");
    t.text("source").notNullable();
    t.text("class_name");
    t.text("message").notNullable();
    t.integer("created_at").notNullable();
    t.text("created_by").references("id").inTable("users").onDelete("SET NULL");
    t.integer("dismissed_at");
    t.text("dismissed_by").references("id").inTable("users").onDelete("SET NULL");
    t.index(["baseline_id", "dismissed_at"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("baseline_warnings");
}
