import { describe, expect, it } from 'vitest';
import { screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { defineRulesFor } from '@domain/abilities';
import type { Role } from '@domain/roles';
import { FirmLayout } from '@/components/layouts/firm-layout';
import type { SessionInfo } from '@/types/api';
import { renderRoutes } from './render';

function sessionFor(role: Role): SessionInfo {
  const user = { id: 'u1', tenantId: 't1', email: 'x@firm.example', name: 'Sam Pell', role, active: true, deactivatedAt: null, lastSignInAt: null, createdAt: '2026-01-01T00:00:00Z' };
  return {
    user,
    tenant: { id: 't1', name: 'Hollowbrook Alarms', shortName: 'hollowbrook', accentColor: '#8f5c17', accentColorReadable: '#8f5c17', logoUrl: null, monitoringCenterName: '', monitoringCenterPhone: '', timeZone: 'UTC', state: 'trialing', trialDaysLeft: 9 },
    rules: defineRulesFor({ id: 'u1', role, tenantId: 't1' }),
    csrfToken: 't',
  };
}

function navLabels(which = 0): string[] {
  const navs = screen.getAllByRole('navigation', { name: 'Workspace' });
  return [...navs[which]!.querySelectorAll('a, button')].map((a) => a.textContent?.trim() ?? '').filter((t) => t !== 'Sign out' || which === 1);
}

describe('firm navigation shows only what the role may use', () => {
  const cases: [Role, string[]][] = [
    ['owner', ['Overview', 'Jobs', 'Schedule', 'Clients', 'Staff', 'Business', 'Billing', 'Firm settings']],
    ['coordinator', ['Overview', 'Jobs', 'Schedule', 'Clients', 'Staff']],
    ['technician', ['Overview', 'Today', 'Jobs', 'Schedule', 'Clients', 'Staff']],
  ];
  it.each(cases)('%s sees %j', (role, expected) => {
    renderRoutes([{ path: '/', element: <FirmLayout /> }], { session: sessionFor(role) });
    expect(navLabels()).toEqual(expected);
    expect(screen.getAllByText('Hollowbrook Alarms').length).toBeGreaterThan(0);
    expect(screen.getByText('Trial · 9 days left')).toBeInTheDocument();
  });

  const phoneCases: [Role, string[]][] = [
    ['technician', ['Today', 'Jobs', 'Clients', 'More']],
    ['coordinator', ['Overview', 'Jobs', 'Clients', 'More']],
  ];
  it.each(phoneCases)('%s has four items in the phone bar: %j', (role, expected) => {
    renderRoutes([{ path: '/', element: <FirmLayout /> }], { session: sessionFor(role) });
    expect(navLabels(1)).toEqual(expected);
  });

  const moreCases: [Role, string[]][] = [
    ['owner', ['Schedule', 'Staff', 'Business', 'Billing', 'Firm settings']],
    ['coordinator', ['Schedule', 'Staff']],
    ['technician', ['Overview', 'Schedule', 'Staff']],
  ];
  it.each(moreCases)('%s finds the other sections and sign out under “More” on a phone: %j', async (role, expected) => {
    renderRoutes([{ path: '/', element: <FirmLayout /> }], { session: sessionFor(role) });
    expect(screen.queryByRole('list', { name: 'More sections' })).toBeNull();
    const more = screen.getByRole('button', { name: 'More' });
    await userEvent.click(more);
    expect(more).toHaveAttribute('aria-expanded', 'true');
    const list = screen.getByRole('list', { name: 'More sections' });
    expect(within(list).getAllByRole('link').map((a) => a.textContent?.trim())).toEqual(expected);
    expect(within(list).getByRole('button', { name: /Sign out/ })).toBeInTheDocument();
    await userEvent.keyboard('{Escape}');
    expect(screen.queryByRole('list', { name: 'More sections' })).toBeNull();
  });
});
