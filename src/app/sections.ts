/** The console's sections, in navigation order. One list drives the menu and the routes. */
import type { Role } from '#shared/schemas/accounts.ts';

export interface Section {
  path: string;
  label: string;
  summary: string;
  /** Roles that see the section; all when absent. The server enforces the same rule. */
  roles?: readonly Role[];
}

export const sections: Section[] = [
  { path: '/', label: 'Overview', summary: "This month's calls against your plan, recent errors and your first steps." },
  { path: '/keys', label: 'Keys', summary: 'Server keys for your own software and embed keys for your sites: create, rotate, revoke.' },
  { path: '/usage', label: 'Usage', summary: 'Calls by day, by endpoint and by key, with the recent request log.' },
  { path: '/playground', label: 'Playground', summary: 'Try every calculation with a form, see the result and copy it as code.' },
  { path: '/reference', label: 'API reference', summary: 'The OpenAPI document, rendered: every endpoint, field and problem type.' },
  { path: '/widgets', label: 'Widgets', summary: 'Configure an embeddable calculator, preview it live and copy the snippet.' },
  { path: '/catalog', label: 'Catalog', summary: 'Your own host units and packs, by form or CSV upload, for your widgets.' },
  { path: '/team', label: 'Team', summary: 'Members, their roles and open invitations.' },
  { path: '/billing', label: 'Billing', summary: 'Your plan, invoices and payment method.', roles: ['owner'] },
  { path: '/audit', label: 'Audit log', summary: 'Who did what, when and from where.', roles: ['owner', 'admin'] },
  { path: '/settings', label: 'Settings', summary: 'Organization name and preferences.' },
];

export const visibleSections = (role: Role | null | undefined) => sections.filter((s) => !s.roles || (role != null && s.roles.includes(role)));
