-- Audit rows form a hash chain: prev_hash is the predecessor's hash (64 zeros for the first row) and hash is the
-- SHA-256 (hex) of the RFC 8785 canonical JSON of
--   {"action","actorId","at","detail","id","prevHash","subjectId","subjectType"}
-- where "at" is the time in UTC as YYYY-MM-DDTHH:MI:SS.ffffffZ and "detail" is the jsonb's own text as a JSON string.
-- The same envelope is built in server/features/audit/audit-chain.ts; a test checks that both agree.
-- Keys are written below in RFC 8785 order (UTF-16 code units); to_json(text) escapes strings as RFC 8785 asks
-- (", \ and U+0000..U+001F only, lower-case \u00xx), and ids are plain integers.
ALTER TABLE "audit_events" ADD COLUMN "prev_hash" text;--> statement-breakpoint
ALTER TABLE "audit_events" ADD COLUMN "hash" text;--> statement-breakpoint
-- Existing rows get their links here; the append-only trigger is set aside for this one backfill only.
ALTER TABLE "audit_events" DISABLE TRIGGER audit_events_append_only;--> statement-breakpoint
DO $$
DECLARE
  r record;
  prev text := repeat('0', 64);
  h text;
BEGIN
  FOR r IN SELECT * FROM audit_events ORDER BY id LOOP
    h := encode(sha256(convert_to(
      '{"action":' || to_json(r.action)::text
      || ',"actorId":' || coalesce(r.actor_id::text, 'null')
      || ',"at":' || to_json(to_char(r.at AT TIME ZONE 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.US"Z"'))::text
      || ',"detail":' || to_json(r.detail::text)::text
      || ',"id":' || r.id::text
      || ',"prevHash":' || to_json(prev)::text
      || ',"subjectId":' || coalesce(to_json(r.subject_id)::text, 'null')
      || ',"subjectType":' || to_json(r.subject_type)::text
      || '}', 'UTF8')), 'hex');
    UPDATE audit_events SET prev_hash = prev, hash = h WHERE id = r.id;
    prev := h;
  END LOOP;
END $$;--> statement-breakpoint
ALTER TABLE "audit_events" ENABLE TRIGGER audit_events_append_only;--> statement-breakpoint
ALTER TABLE "audit_events" ALTER COLUMN "prev_hash" SET NOT NULL;--> statement-breakpoint
ALTER TABLE "audit_events" ALTER COLUMN "hash" SET NOT NULL;
