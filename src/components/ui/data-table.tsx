import type { HTMLAttributes } from 'react';
import { flexRender, type Row, type RowData, type Table } from '@tanstack/react-table';

declare module '@tanstack/react-table' {
  // The type parameters must match TanStack's declaration to merge with it.
  // eslint-disable-next-line @typescript-eslint/no-unused-vars
  interface ColumnMeta<TData extends RowData, TValue> {
    /** Added to this column's header and cells (e.g. `text-right` for numbers). */
    className?: string;
    /** Added to this column's cells only. */
    cellClassName?: string;
  }
}

const join = (...classes: (string | undefined)[]) => classes.filter(Boolean).join(' ');

export interface DataTableLook {
  table: string;
  head: string;
  th: string;
  row?: string;
  td: string;
}

/** The classes most of our tables share: a paper header row, a line under each row. */
export const plainTableLook: DataTableLook = {
  table: 'w-full text-left text-sm',
  head: 'border-b border-line bg-paper text-xs uppercase tracking-wide text-ink-soft',
  th: 'px-4 py-3',
  row: 'border-b border-line last:border-0',
  td: 'px-4 py-2',
};

/**
 * A TanStack table drawn as a plain `<table>`: the columns say what a cell shows, the look how the
 * table is drawn; `rowProps` adds a row's own classes or data attributes.
 */
export function DataTable<T>({
  table,
  look = plainTableLook,
  rowProps,
  ...props
}: {
  table: Table<T>;
  look?: DataTableLook;
  rowProps?: (row: Row<T>) => HTMLAttributes<HTMLTableRowElement> & Record<`data-${string}`, string | number | undefined>;
} & Omit<HTMLAttributes<HTMLTableElement>, 'children'> &
  Record<`data-${string}`, string | undefined>) {
  return (
    <table className={look.table} {...props}>
      <thead className={look.head}>
        {table.getHeaderGroups().map((group) => (
          <tr key={group.id}>
            {group.headers.map((h) => (
              <th key={h.id} className={join(look.th, h.column.columnDef.meta?.className)}>
                {h.isPlaceholder ? null : flexRender(h.column.columnDef.header, h.getContext())}
              </th>
            ))}
          </tr>
        ))}
      </thead>
      <tbody>
        {table.getRowModel().rows.map((row) => {
          const { className, ...attributes } = rowProps?.(row) ?? {};
          return (
            <tr key={row.id} className={join(look.row, className)} {...attributes}>
              {row.getVisibleCells().map((c) => (
                <td key={c.id} className={join(look.td, c.column.columnDef.meta?.className, c.column.columnDef.meta?.cellClassName)}>
                  {flexRender(c.column.columnDef.cell, c.getContext())}
                </td>
              ))}
            </tr>
          );
        })}
      </tbody>
    </table>
  );
}
