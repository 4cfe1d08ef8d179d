import type { ReactNode } from "react";

/**
 * One header cell: a plain label, or a label with extra classes (alignment, width), its own padding instead of the
 * table's (`cell`) and an option to show it to screen readers only.
 */
export type Column = string | { label: ReactNode; className?: string; cell?: string; srOnly?: boolean };

/**
 * The header row of a table from its column labels. Every cell gets `cell` (padding) and `font-medium`, the last
 * one `lastCell` instead of `cell` (tables whose last column drops its right padding), plus its column's own classes.
 */
export function TableHead({
  columns,
  cell,
  lastCell = cell,
  className,
  rowClassName,
}: {
  columns: Column[];
  cell: string;
  lastCell?: string;
  className?: string;
  rowClassName?: string;
}) {
  return (
    <thead className={className}>
      <tr className={rowClassName}>
        {columns.map((c, i) => {
          const col: Exclude<Column, string> = typeof c === "string" ? { label: c } : c;
          return (
            <th
              key={i}
              scope="col"
              className={[col.cell ?? (i === columns.length - 1 ? lastCell : cell), col.className, "font-medium"].filter(Boolean).join(" ")}
            >
              {col.srOnly ? <span className="sr-only">{col.label}</span> : col.label}
            </th>
          );
        })}
      </tr>
    </thead>
  );
}

/** A table in its own bordered panel that scrolls sideways on narrow screens (list pages, the CSV help), with its header row. */
export function PanelTable({
  className = "",
  tableClassName,
  headClassName,
  columns,
  children,
}: {
  className?: string;
  tableClassName: string;
  headClassName: string;
  columns: Column[];
  children: ReactNode;
}) {
  return (
    <div className={`overflow-x-auto rounded-lg border border-rule bg-panel ${className}`.trim()}>
      <table className={tableClassName}>
        <TableHead className={headClassName} cell="px-3 py-2" columns={columns} />
        {children}
      </table>
    </div>
  );
}
