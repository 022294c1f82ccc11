// Every module's OpenAPI registrations, imported for their side effect on the registry.
import '../modules/health/health.openapi.ts';
import '../modules/usage/usage.openapi.ts';
import '../modules/auth/auth.openapi.ts';
import '../modules/accounts/accounts.openapi.ts';
import '../modules/organizations/organizations.openapi.ts';
import '../modules/members/members.openapi.ts';
import '../modules/invitations/invitations.openapi.ts';
import '../modules/audit/audit.openapi.ts';
import '../modules/dev-mailbox/dev-mailbox.openapi.ts';
import '../modules/wires/wires.openapi.ts';
import '../modules/fuses/fuses.openapi.ts';
import '../modules/parallel/parallel.openapi.ts';
import '../modules/compatibility/compatibility.openapi.ts';
import '../modules/conductors/conductors.openapi.ts';
