// Every module's OpenAPI registrations, imported for their side effect on the registry.
import '../modules/health/health.openapi.ts';
import '../modules/usage/usage.openapi.ts';
