-- request_log.api_key_id loses its foreign key: the check cost one lookup per logged call, and keys are only
-- deleted with their organization, whose log rows go with it by the organization_id cascade.
ALTER TABLE "request_log" DROP CONSTRAINT "request_log_api_key_id_api_keys_id_fk";
