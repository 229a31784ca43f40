import { useState } from 'react';
import { describe, expect, it, vi } from 'vitest';
import { render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { ColumnDef, SortingState } from '@tanstack/react-table';
import { DataTable, sortParam } from '@/components/ui/data-table';

interface Row {
  id: string;
  name: string;
}
const columns: ColumnDef<Row, unknown>[] = [{ id: 'name', accessorKey: 'name', header: 'Name' }];
const rows: Row[] = [
  { id: '1', name: 'Alder' },
  { id: '2', name: 'Birch' },
];

function Harness({ onSort, onPage, total = 60 }: { onSort: (s: string | undefined) => void; onPage: (p: number) => void; total?: number }) {
  const [sorting, setSorting] = useState<SortingState>([{ id: 'name', desc: false }]);
  const [page, setPage] = useState(1);
  return (
    <DataTable
      caption="Test rows"
      columns={columns}
      data={rows}
      sorting={sorting}
      onSortingChange={(updater) => {
        const next = typeof updater === 'function' ? updater(sorting) : updater;
        setSorting(next);
        onSort(sortParam(next));
      }}
      page={page}
      pageSize={25}
      total={total}
      onPageChange={(p) => {
        setPage(p);
        onPage(p);
      }}
    />
  );
}

describe('DataTable', () => {
  it('toggles the server sort between ascending and descending and says so to screen readers', async () => {
    const onSort = vi.fn();
    render(<Harness onSort={onSort} onPage={vi.fn()} />);
    const header = screen.getByRole('columnheader', { name: /Name/ });
    expect(header).toHaveAttribute('aria-sort', 'ascending');
    await userEvent.click(within(header).getByRole('button'));
    expect(onSort).toHaveBeenLastCalledWith('-name');
    expect(screen.getByRole('columnheader', { name: /Name/ })).toHaveAttribute('aria-sort', 'descending');
    await userEvent.click(within(screen.getByRole('columnheader', { name: /Name/ })).getByRole('button'));
    expect(onSort).toHaveBeenLastCalledWith('name');
  });

  it('pages through the total the server reports', async () => {
    const onPage = vi.fn();
    render(<Harness onSort={vi.fn()} onPage={onPage} />);
    expect(screen.getByText('1–25 of 60')).toBeInTheDocument();
    expect(screen.getByText('Page 1 of 3')).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Previous page' })).toBeDisabled();
    await userEvent.click(screen.getByRole('button', { name: 'Next page' }));
    await userEvent.click(screen.getByRole('button', { name: 'Next page' }));
    expect(onPage).toHaveBeenLastCalledWith(3);
    expect(screen.getByText('51–60 of 60')).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Next page' })).toBeDisabled();
  });
});
