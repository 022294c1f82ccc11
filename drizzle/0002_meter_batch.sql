-- meter_batch: counts a batch of successful metered calls in one statement, exactly.
--
-- Each item is one call that is ready to be answered 2xx: {"i", "org", "key", "endpoint", "quota",
-- "rate", "idem"?, "hash"?, "status"?, "body"?}. Per organization (in a fixed order, so concurrent
-- batches from several server instances lock rows in the same order), the monthly and per-minute
-- counters are locked, and items are granted in arrival order while both limits allow. A granted item
-- with an Idempotency-Key stores its answer; if that key was already stored, the item is a
-- "duplicate" and is not counted. Granted items are added to usage_counters (organization, key,
-- endpoint, UTC day). Time comes from the database clock unless "at" is given (tests), so every
-- instance agrees on the day, the month and the minute window.
CREATE OR REPLACE FUNCTION meter_batch(items jsonb, at timestamptz DEFAULT NULL)
RETURNS TABLE (i integer, outcome text, month_calls bigint, window_calls integer, month_start date, window_start timestamptz)
LANGUAGE plpgsql AS $$
#variable_conflict use_column
DECLARE
  t timestamptz := coalesce(at, now());
  v_month date := (date_trunc('month', t, 'UTC') AT TIME ZONE 'UTC')::date;
  v_day date := (t AT TIME ZONE 'UTC')::date;
  v_window timestamptz := date_trunc('minute', t, 'UTC');
  g record;
  it record;
  m bigint;
  w integer;
  v_outcome text;
  -- Results, column by column (arrays avoid a temporary table and its catalog churn on every batch).
  r_i integer[] := '{}';
  r_org uuid[] := '{}';
  r_key uuid[] := '{}';
  r_endpoint text[] := '{}';
  r_outcome text[] := '{}';
  r_month bigint[] := '{}';
  r_window integer[] := '{}';
BEGIN

  FOR g IN
    SELECT (x->>'org')::uuid AS org, max((x->>'quota')::bigint) AS quota, max((x->>'rate')::integer) AS rate
    FROM jsonb_array_elements(items) AS x
    GROUP BY 1 ORDER BY 1
  LOOP
    INSERT INTO organization_monthly_usage AS u (organization_id, month, calls) VALUES (g.org, v_month, 0)
      ON CONFLICT (organization_id, month) DO NOTHING;
    SELECT u.calls INTO m FROM organization_monthly_usage u WHERE u.organization_id = g.org AND u.month = v_month FOR UPDATE;
    INSERT INTO rate_windows AS r (organization_id, window_start, calls) VALUES (g.org, v_window, 0)
      ON CONFLICT (organization_id, window_start) DO NOTHING;
    SELECT r.calls INTO w FROM rate_windows r WHERE r.organization_id = g.org AND r.window_start = v_window FOR UPDATE;

    FOR it IN
      SELECT (x->>'i')::integer AS idx, (x->>'key')::uuid AS key, x->>'endpoint' AS endpoint,
             x->>'idem' AS idem, x->>'hash' AS hash, coalesce((x->>'status')::smallint, 200) AS status, x->'body' AS body
      FROM jsonb_array_elements(items) AS x
      WHERE (x->>'org')::uuid = g.org
      ORDER BY (x->>'i')::integer
    LOOP
      IF m >= g.quota THEN
        v_outcome := 'quota';
      ELSIF w >= g.rate THEN
        v_outcome := 'rate';
      ELSE
        v_outcome := 'ok';
        IF it.idem IS NOT NULL THEN
          INSERT INTO idempotency_records (api_key_id, idempotency_key, request_hash, status, body, created_at)
            VALUES (it.key, it.idem, it.hash, it.status, coalesce(it.body, 'null'::jsonb), t)
            ON CONFLICT (api_key_id, idempotency_key) DO NOTHING;
          IF NOT FOUND THEN
            v_outcome := 'duplicate';
          END IF;
        END IF;
        IF v_outcome = 'ok' THEN
          m := m + 1;
          w := w + 1;
        END IF;
      END IF;
      r_i := r_i || it.idx;
      r_org := r_org || g.org;
      r_key := r_key || it.key;
      r_endpoint := r_endpoint || it.endpoint;
      r_outcome := r_outcome || v_outcome;
      r_month := r_month || m;
      r_window := r_window || w;
    END LOOP;

    UPDATE organization_monthly_usage u SET calls = m WHERE u.organization_id = g.org AND u.month = v_month;
    UPDATE rate_windows r SET calls = w WHERE r.organization_id = g.org AND r.window_start = v_window;
  END LOOP;

  INSERT INTO usage_counters AS c (organization_id, api_key_id, endpoint, day, calls)
    SELECT res.org, res.key, res.endpoint, v_day, count(*)
    FROM unnest(r_org, r_key, r_endpoint, r_outcome) AS res(org, key, endpoint, outcome)
    WHERE res.outcome = 'ok'
    GROUP BY res.org, res.key, res.endpoint
    ORDER BY res.org, res.key, res.endpoint
  ON CONFLICT (organization_id, api_key_id, endpoint, day) DO UPDATE SET calls = c.calls + excluded.calls;

  -- Last use of each key, at most every 30 seconds (saves row churn on hot keys).
  UPDATE api_keys k SET last_used_at = t
    WHERE k.id IN (SELECT DISTINCT res.key FROM unnest(r_key, r_outcome) AS res(key, outcome) WHERE res.outcome = 'ok')
      AND (k.last_used_at IS NULL OR k.last_used_at < t - interval '30 seconds');

  RETURN QUERY
    SELECT res.i, res.outcome, res.month_calls, res.window_calls, v_month, v_window
    FROM unnest(r_i, r_outcome, r_month, r_window) AS res(i, outcome, month_calls, window_calls)
    ORDER BY res.i;
END;
$$;
