/**
 * Own-property lookups for every keyed table (the metals and dielectrics catalogues, unit prefixes, overrides by
 * class name, materials by metal id). `table[key]` and `key in table` also find what every object inherits from
 * Object.prototype ("constructor", "toString", "__proto__", "hasOwnProperty"…), so a metal named "constructor" would
 * pass a check and then look up a function; these helpers see only the table's own entries.
 */
export function hasOwnKey(table: object | undefined | null, key: string): boolean {
  return table !== undefined && table !== null && Object.prototype.hasOwnProperty.call(table, key);
}

/** The table's own entry for `key`, or undefined (never an inherited Object.prototype member). */
export function ownEntry<V>(table: Readonly<Record<string, V>> | undefined | null, key: string): V | undefined {
  return hasOwnKey(table, key) ? table![key] : undefined;
}
