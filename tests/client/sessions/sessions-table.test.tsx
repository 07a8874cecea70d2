// @vitest-environment happy-dom
import { cleanup, fireEvent, render, screen, within } from '@testing-library/react';
import { MemoryRouter } from 'react-router-dom';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { SessionSummary } from '../../../shared/api/responses';
import { SessionsTable } from '../../../src/features/sessions/components/sessions-table';

afterEach(cleanup);

const session = (id: string, name: string, updatedAt: string, editor: string): SessionSummary => ({
  id,
  studioId: 's',
  name,
  archived: false,
  createdAt: updatedAt,
  updatedAt,
  createdBy: { id: 'u', displayName: editor },
  updatedBy: { id: 'u', displayName: editor },
});

const sessions = [
  session('a', 'Lighthouse stair climb', '2026-11-30T10:00:00.000Z', 'Tamsin Okafor'),
  session('b', 'Storm-surge chase pulse', '2026-12-01T09:00:00.000Z', 'Wren Halloway'),
  session('c', 'Bell buoy drone', '2026-11-29T08:00:00.000Z', 'Pell Ashby'),
];

function names(): string[] {
  return within(screen.getByRole('table')).getAllByRole('link').map((link) => link.textContent ?? '');
}

describe('sessions table', () => {
  it('lists newest first, and sorts by a header from the keyboard with aria-sort telling the order', () => {
    render(
      <MemoryRouter>
        <SessionsTable sessions={sessions} canEdit onRename={() => {}} onArchive={() => {}} />
      </MemoryRouter>,
    );
    expect(names()).toEqual(['Storm-surge chase pulse', 'Lighthouse stair climb', 'Bell buoy drone']);
    const byName = screen.getByRole('button', { name: /^Session/ });
    byName.focus();
    fireEvent.click(byName);
    expect(names()).toEqual(['Bell buoy drone', 'Lighthouse stair climb', 'Storm-surge chase pulse']);
    expect(screen.getByRole('columnheader', { name: /Session/ }).getAttribute('aria-sort')).toBe('ascending');
    fireEvent.click(byName);
    expect(names()[0]).toBe('Storm-surge chase pulse');
    expect(screen.getByRole('columnheader', { name: /Session/ }).getAttribute('aria-sort')).toBe('descending');
  });

  it('searches by name and says when nothing matches', () => {
    render(
      <MemoryRouter>
        <SessionsTable sessions={sessions} canEdit onRename={() => {}} onArchive={() => {}} />
      </MemoryRouter>,
    );
    fireEvent.change(screen.getByLabelText('Search sessions'), { target: { value: 'BUOY' } });
    expect(names()).toEqual(['Bell buoy drone']);
    fireEvent.change(screen.getByLabelText('Search sessions'), { target: { value: 'harp' } });
    expect(screen.getByText('No session matches')).toBeTruthy();
  });

  it('disables rename and archive for roles that may not edit, with the reason, and calls back for those who may', () => {
    const onArchive = vi.fn();
    const { rerender } = render(
      <MemoryRouter>
        <SessionsTable sessions={sessions} canEdit={false} onRename={() => {}} onArchive={onArchive} />
      </MemoryRouter>,
    );
    const rename = screen.getByRole('button', { name: 'Rename Bell buoy drone' }) as HTMLButtonElement;
    expect(rename.disabled).toBe(true);
    expect(rename.title).toBe('only leads and designers can create or edit sessions');
    rerender(
      <MemoryRouter>
        <SessionsTable sessions={sessions} canEdit onRename={() => {}} onArchive={onArchive} />
      </MemoryRouter>,
    );
    fireEvent.click(screen.getByRole('button', { name: 'Archive Bell buoy drone' }));
    // Asked first: nothing happens until confirmed, and cancelling withdraws it.
    expect(onArchive).not.toHaveBeenCalled();
    expect(screen.getByText("Archive Bell buoy drone? It leaves the studio's list; Restore brings it back.")).toBeTruthy();
    fireEvent.click(screen.getByRole('button', { name: 'Cancel' }));
    expect(onArchive).not.toHaveBeenCalled();
    fireEvent.click(screen.getByRole('button', { name: 'Archive Bell buoy drone' }));
    fireEvent.click(screen.getByRole('button', { name: 'Yes, archive' }));
    expect(onArchive).toHaveBeenCalledWith(sessions[2], true);
  });
});
