import { useMemo, useState, type ReactNode } from 'react';

export interface Column<Row> {
  key: string;
  header: string;
  render: (row: Row) => ReactNode;
  /** When given, the column sorts by this value. */
  sortValue?: (row: Row) => string | number;
  className?: string;
}

export interface DataTableProps<Row> {
  caption: string;
  rows: Row[];
  columns: Column<Row>[];
  rowKey: (row: Row) => string;
  initialSort?: { key: string; direction: 'ascending' | 'descending' };
}

/**
 * A table that sorts by its column headers (buttons, so the keyboard works; aria-sort tells screen
 * readers the order). Row content is links and buttons, reachable with Tab.
 */
export function DataTable<Row>({ caption, rows, columns, rowKey, initialSort }: DataTableProps<Row>) {
  const [sort, setSort] = useState(initialSort ?? null);
  const sorted = useMemo(() => {
    const column = columns.find((candidate) => candidate.key === sort?.key);
    if (!sort || !column?.sortValue) return rows;
    const value = column.sortValue;
    const factor = sort.direction === 'ascending' ? 1 : -1;
    return [...rows].sort((a, b) => {
      const [x, y] = [value(a), value(b)];
      return (typeof x === 'number' && typeof y === 'number' ? x - y : String(x).localeCompare(String(y))) * factor;
    });
  }, [rows, columns, sort]);

  return (
    <div className="overflow-x-auto rounded-lg border border-slate-700/20 dark:border-slate-300/15">
      <table className="w-full border-collapse text-left text-sm">
        <caption className="sr-only">{caption}</caption>
        <thead className="bg-slate-700/5 dark:bg-slate-100/5">
          <tr>
            {columns.map((column) => {
              const active = sort?.key === column.key;
              return (
                <th key={column.key} scope="col" aria-sort={active ? sort?.direction : undefined} className={`px-3 py-2 font-semibold ${column.className ?? ''}`}>
                  {column.sortValue ? (
                    <button
                      type="button"
                      className="inline-flex items-center gap-1 rounded focus-visible:outline-2 focus-visible:outline-teal-400"
                      onClick={() =>
                        setSort({ key: column.key, direction: active && sort?.direction === 'ascending' ? 'descending' : 'ascending' })
                      }
                    >
                      {column.header}
                      <span aria-hidden="true" className="w-3 text-xs">
                        {active ? (sort?.direction === 'ascending' ? '▲' : '▼') : ''}
                      </span>
                    </button>
                  ) : (
                    column.header
                  )}
                </th>
              );
            })}
          </tr>
        </thead>
        <tbody>
          {sorted.map((row) => (
            <tr key={rowKey(row)} className="border-t border-slate-700/10 hover:bg-brass-400/5 dark:border-slate-300/10">
              {columns.map((column) => (
                <td key={column.key} className={`px-3 py-2 align-middle ${column.className ?? ''}`}>
                  {column.render(row)}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
