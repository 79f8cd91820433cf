-- bench:scale volumes (issue 14): a busy lab's year. Fictional rows only; every name and address is made up.
-- 500 users, 2 000 model profiles, 100 000 plans with 1-3 revisions each, 1 000 000 audit rows, 200 000 outbox rows
-- and 200 000 sink messages. Revision content and fingerprint are small stand-ins (lists never read them); audit hashes are random,
-- so /api/audit/verify reports this trail as broken (bench data is never verified).
SET synchronous_commit = off;

INSERT INTO users (email, name, password_hash, roles)
SELECT format('bench%s@ropewalk.test', g), format('%s %s', (ARRAY['Ada','Bram','Cleo','Dov','Esme','Femi','Gus','Hana','Ivo','Juno'])[1 + g % 10],
       format('Ropemaker%s', g)), (SELECT password_hash FROM users WHERE email = 'researcher@ropewalk.test'),
       CASE WHEN g % 10 = 0 THEN ARRAY['approver'] ELSE ARRAY['researcher'] END
FROM generate_series(1, 494) g;

INSERT INTO model_profiles (name, family, head_dim, rope_theta, trained_context, layers, attention_heads, kv_heads,
                            hidden_size, parameters, created_by)
SELECT format('Halyard-%s-%sB', g, 1 + g % 70), (ARRAY['Halyard','Bowline','Sheepshank','Clove'])[1 + g % 4], 128,
       10000 * (1 + g % 50), 4096 * (1 + g % 8), 32, 32, 8, 4096, 7e9, (SELECT min(id) FROM users)
FROM generate_series(1, 2000 - (SELECT count(*) FROM model_profiles)) g;

CREATE TEMP TABLE bench_people AS SELECT row_number() OVER (ORDER BY id) AS n, id FROM users;
CREATE TEMP TABLE bench_models AS SELECT row_number() OVER (ORDER BY id) AS n, id FROM model_profiles;
CREATE INDEX ON bench_people (n);
CREATE INDEX ON bench_models (n);
ANALYZE bench_people;
ANALYZE bench_models;

INSERT INTO plans (title, purpose, owner_id, model_id, created_at, updated_at)
SELECT format('%s stretch %s to %sk, lot %s', (ARRAY['Tarred','Manila','Hemp','Sisal','Coir'])[1 + g % 5],
              (ARRAY['YaRN','NTK','linear','llama3','LongRoPE'])[1 + g % 5], 8 * (1 + g % 32), g),
       format('Longer context for the %s line, batch %s', (ARRAY['harbour','rigging','mooring','towline'])[1 + g % 4], g % 997),
       (SELECT id FROM bench_people WHERE n = 1 + (g::bigint * 7919) % (SELECT count(*) FROM bench_people)),
       (SELECT id FROM bench_models WHERE n = 1 + (g::bigint * 104729) % (SELECT count(*) FROM bench_models)),
       now() - make_interval(secs => (100000 - g) * 300), now() - make_interval(secs => (100000 - g) * 300 - 60)
FROM generate_series(1, 100000) g;

-- The stored latest state is filled once below instead of by the per-row trigger (200 000 plan updates).
ALTER TABLE plan_revisions DISABLE TRIGGER plan_revisions_keep_latest;

-- 1-3 revisions per plan; the older ones decided, the latest in any state (about 5 000 in review).
INSERT INTO plan_revisions (plan_id, number, state, author_id, content, content_hash, engine_version, rotary_fingerprint,
                            submitted_at, created_at)
SELECT p.id, r.n,
       CASE WHEN r.n < 1 + p.id % 3 THEN (ARRAY['superseded','changes_requested'])[1 + (p.id + r.n) % 2]
            ELSE (ARRAY['draft','approved','in_review','draft','approved','changes_requested','draft','approved','approved',
                        'draft','approved','draft','approved','draft','approved','draft','approved','draft','approved','draft'])[1 + p.id % 20] END,
       p.owner_id, '{"bench": true}'::jsonb, md5(p.id::text || '/' || r.n), 'bench', 'bench',
       p.created_at + make_interval(mins => r.n), p.created_at
FROM plans p CROSS JOIN LATERAL generate_series(1, 1 + p.id % 3) AS r(n)
WHERE p.title LIKE '% lot %';

-- The same fill as migrations 0013's and 0024's backfills (no revision here carries a proof, so approved_proof stays null).
UPDATE plans p SET latest_number = l.number, latest_state = l.state,
  approved_number = (SELECT max(r.number) FROM plan_revisions r WHERE r.plan_id = p.id AND r.state = 'approved'),
  approved_proof = (SELECT r.proof FROM plan_revisions r WHERE r.plan_id = p.id AND r.state = 'approved')
FROM (SELECT DISTINCT ON (plan_id) plan_id, number, state FROM plan_revisions ORDER BY plan_id, number DESC) l
WHERE l.plan_id = p.id;
ALTER TABLE plan_revisions ENABLE TRIGGER plan_revisions_keep_latest;

INSERT INTO audit_events (at, actor_id, action, subject_type, subject_id, detail, prev_hash, hash)
SELECT now() - make_interval(secs => (1000000 - g) * 30),
       (SELECT id FROM bench_people WHERE n = 1 + (g::bigint * 31) % (SELECT count(*) FROM bench_people)),
       (ARRAY['plan.created','revision.edited','revision.submitted','decision.approve','user.signed_in'])[1 + g % 5],
       'plan', (1 + g % 100000)::text, jsonb_build_object('bench', g), md5('p' || g) || md5('q' || g), md5('h' || g) || md5('i' || g)
FROM generate_series(1, 1000000) g;

INSERT INTO mail_outbox (kind, to_addresses, subject, body, status, attempts, created_at, sent_at)
SELECT 'decision', ARRAY[format('bench%s@ropewalk.test', 1 + g % 494)], format('Plan lot %s: decision', g), 'bench', 'sent', 1,
       now() - make_interval(secs => (200000 - g) * 60), now() - make_interval(secs => (200000 - g) * 60)
FROM generate_series(1, 200000) g;

INSERT INTO mail_sink_messages (received_at, message_id, from_address, to_addresses, subject, text, raw)
SELECT now() - make_interval(secs => (200000 - g) * 60), format('<outbox-%s@ropewalk.local>', g), 'ropewalk@ropewalk.test',
       ARRAY[format('bench%s@ropewalk.test', 1 + g % 494)], format('Plan lot %s: decision', g), 'bench', 'bench'
FROM generate_series(1, 200000) g;

ANALYZE;
