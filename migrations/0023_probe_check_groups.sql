-- Probe checks keep every layer group's own result (kind, layers, passed, worst error and pair, cause) beside the
-- check's worst-group fields; checks recorded before this column have none (null).
ALTER TABLE "conformance_checks" ADD COLUMN "groups" jsonb;