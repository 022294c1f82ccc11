import {
  CreateOrganizationInputSchema,
  DeleteOrganizationInputSchema,
  OrganizationSchema,
  OrganizationSummarySchema,
  TransferOwnershipInputSchema,
  UpdateOrganizationInputSchema,
} from '#shared/schemas/accounts.ts';
import { registerConsolePath } from '../console/console.openapi.ts';

registerConsolePath({
  method: 'post',
  path: '/organizations',
  summary: 'Create an organization',
  description: 'Creates an organization owned by the signed-in user and makes it the active one.',
  access: 'session',
  body: CreateOrganizationInputSchema,
  response: { status: 201, description: 'Created.', schema: OrganizationSummarySchema },
});

registerConsolePath({
  method: 'get',
  path: '/organization',
  summary: 'The active organization',
  description: 'Name, short name, plan and member count.',
  access: ['owner', 'admin', 'developer', 'viewer'],
  response: { status: 200, description: 'The organization.', schema: OrganizationSchema },
});

registerConsolePath({
  method: 'patch',
  path: '/organization',
  summary: 'Rename the organization',
  description: 'Recorded in the audit log.',
  access: ['owner', 'admin'],
  body: UpdateOrganizationInputSchema,
  response: { status: 200, description: 'Renamed.', schema: OrganizationSchema },
});

registerConsolePath({
  method: 'delete',
  path: '/organization',
  summary: 'Delete the organization',
  description: 'Deletes the organization with its members, keys, usage and invitations. Type its name to confirm.',
  access: ['owner'],
  body: DeleteOrganizationInputSchema,
  response: { status: 204, description: 'Deleted.' },
  problems: { 409: 'Records that must be closed first still exist.', 422: 'The typed name does not match.' },
});

registerConsolePath({
  method: 'post',
  path: '/organization/transfer-ownership',
  summary: 'Transfer ownership',
  description: 'Makes another member the owner; you become an admin.',
  access: ['owner'],
  body: TransferOwnershipInputSchema,
  response: { status: 204, description: 'Transferred.' },
  problems: { 404: 'No such member in your organization.' },
});
