import type { Knex } from "knex";

// Physical quantities in SI base units (m, Ω, F, s) as REAL.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("baselines", (t) => {
    t.text("id").primary();
    t.text("team_id").notNullable().references("teams.id").onDelete("CASCADE");
    t.text("name").notNullable();
    t.text("description").notNullable().defaultTo("");
    // Technology (supply, clock, repeater R0/C0, delay budget) as validated JSON.
    t.text("technology").notNullable();
    t.integer("is_demo").notNullable().defaultTo(0);
    t.integer("version").notNullable().defaultTo(1);
    t.text("created_by").references("users.id").onDelete("SET NULL");
    t.integer("created_at").notNullable();
    t.text("updated_by").references("users.id").onDelete("SET NULL");
    t.integer("updated_at").notNullable();
    t.unique(["team_id", "name"]);
  });
  await knex.schema.createTable("wire_classes", (t) => {
    t.text("id").primary();
    t.text("baseline_id").notNullable().references("baselines.id").onDelete("CASCADE");
    t.integer("position").notNullable();
    t.text("name").notNullable();
    t.text("tier").notNullable().checkIn(["local", "intermediate", "semi-global", "global"]);
    t.double("width_m").notNullable();
    t.double("thickness_m").notNullable();
    t.double("spacing_m").notNullable();
    t.double("ild_below_m");
    t.double("ild_above_m");
    t.double("barrier_m").notNullable();
    t.text("metal").notNullable();
    t.double("k").notNullable();
    t.integer("net_count").notNullable();
    t.double("mean_length_m").notNullable();
    t.double("driver_ohm").notNullable();
    t.double("load_f").notNullable();
    t.double("activity").notNullable();
    t.unique(["baseline_id", "name"]);
  });
  // One row per class: its whole length histogram as two BLOBs of little-endian float64
  // (db/histogram-blob.ts is the only codec): lengths in m, strictly ascending; counts, whole numbers.
  await knex.schema.createTable("class_histograms", (t) => {
    t.text("class_id").primary().references("wire_classes.id").onDelete("CASCADE");
    t.integer("bin_count").notNullable();
    t.integer("net_count").notNullable();
    t.binary("lengths_m").notNullable();
    t.binary("counts").notNullable();
  });
  await knex.schema.createTable("baseline_revisions", (t) => {
    t.increments("id");
    t.text("baseline_id").notNullable().references("baselines.id").onDelete("CASCADE");
    t.integer("version").notNullable();
    t.text("user_id").references("users.id").onDelete("SET NULL");
    t.integer("at").notNullable();
    t.text("summary").notNullable();
    t.text("snapshot").notNullable();
    t.index(["baseline_id", "version"]);
  });
  await knex.schema.createTable("scenarios", (t) => {
    t.text("id").primary();
    t.text("team_id").notNullable().references("teams.id").onDelete("CASCADE");
    t.text("baseline_id").notNullable().references("baselines.id").onDelete("CASCADE");
    t.text("name").notNullable();
    t.text("notes").notNullable().defaultTo("");
    // ScenarioSettings of lib/scaling/types.ts, validated with zod before every write.
    t.text("settings").notNullable();
    t.integer("version").notNullable().defaultTo(1);
    t.integer("is_demo").notNullable().defaultTo(0);
    t.text("created_by").references("users.id").onDelete("SET NULL");
    t.integer("created_at").notNullable();
    t.text("updated_by").references("users.id").onDelete("SET NULL");
    t.integer("updated_at").notNullable();
    t.unique(["baseline_id", "name"]);
    t.index(["team_id"]);
  });
  await knex.schema.createTable("scenario_revisions", (t) => {
    t.increments("id");
    t.text("scenario_id").notNullable().references("scenarios.id").onDelete("CASCADE");
    t.integer("version").notNullable();
    t.text("user_id").references("users.id").onDelete("SET NULL");
    t.integer("at").notNullable();
    t.text("summary").notNullable();
    t.text("name").notNullable();
    t.text("notes").notNullable();
    t.text("settings").notNullable();
    t.index(["scenario_id", "version"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  for (const t of ["scenario_revisions", "scenarios", "baseline_revisions", "class_histograms", "wire_classes", "baselines"]) {
    await knex.schema.dropTableIfExists(t);
  }
}
