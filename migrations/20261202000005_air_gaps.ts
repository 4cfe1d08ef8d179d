import type { Knex } from "knex";

// Air gaps between the lines as geometry (issue 11): the gap's permittivity and the share of the line thickness it
// covers. Both nullable: a class without them has no air gap (homogeneous k), as before.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("wire_classes", (t) => {
    t.double("k_gap");
    t.double("gap_fraction");
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("wire_classes", (t) => {
    t.dropColumn("k_gap");
    t.dropColumn("gap_fraction");
  });
}
