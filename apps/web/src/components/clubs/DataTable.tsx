import { flexRender, type Table } from '@tanstack/react-table';

/** A TanStack table in the clubs' style: ruled rows on raised paper, scrolls sideways on a phone. */
export function DataTable<T>({ table, caption }: { table: Table<T>; caption: string }) {
  return (
    <div className="overflow-x-auto rounded-lg border border-rule bg-paper-raised">
      <table className="w-full text-left">
        <caption className="sr-only">{caption}</caption>
        <thead className="border-b border-rule bg-paper-sunk/60 text-sm text-ink-muted">
          {table.getHeaderGroups().map((group) => (
            <tr key={group.id}>
              {group.headers.map((header) => (
                <th key={header.id} scope="col" className="px-3 py-2 font-medium whitespace-nowrap">
                  {header.column.getCanSort() ? (
                    <button
                      type="button"
                      className="inline-flex min-h-8 items-center gap-1 font-medium hover:text-ink"
                      onClick={header.column.getToggleSortingHandler()}
                    >
                      {flexRender(header.column.columnDef.header, header.getContext())}
                      <span aria-hidden>{{ asc: '↑', desc: '↓' }[header.column.getIsSorted() as string] ?? ''}</span>
                      <span className="sr-only">
                        {header.column.getIsSorted() === 'asc'
                          ? ', sorted up'
                          : header.column.getIsSorted() === 'desc'
                            ? ', sorted down'
                            : ', sort'}
                      </span>
                    </button>
                  ) : (
                    flexRender(header.column.columnDef.header, header.getContext())
                  )}
                </th>
              ))}
            </tr>
          ))}
        </thead>
        <tbody>
          {table.getRowModel().rows.map((row) => (
            <tr key={row.id} className="border-b border-rule last:border-0">
              {row.getVisibleCells().map((cell) => (
                <td key={cell.id} className="px-3 py-2 align-middle">
                  {flexRender(cell.column.columnDef.cell, cell.getContext())}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
