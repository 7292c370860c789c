-- Focal-mechanism geometry: auxiliary plane, P/T/B, moment tensor, Kagan
-- angle, mechanism class.
\i sql/include/setup.sql

-- Shearer, Introduction to Seismology, 2nd ed., sec. 9.3: (30, 60, 40) has
-- auxiliary plane (277.2, 56.2, 143.0)
SELECT round(strike(a)::numeric, 1) AS strike, round(dip(a)::numeric, 1) AS dip,
       round(rake(a)::numeric, 1) AS rake
  FROM (SELECT auxiliary('30/60/40') a) t;

-- canonical cases derived from Aki & Richards conventions: pure thrust, pure
-- normal, vertical sinistral
SELECT f, auxiliary(f), auxiliary_plane(f), p_axis(f), t_axis(f), b_axis(f), mechanism_class(f)
  FROM (VALUES ('0/45/90'::fault_slip), ('0/45/-90'), ('0/90/0'), ('0/90/180')) t(f);

-- Global CMT nodal planes, from memory (1-degree precision): Tohoku 2011
-- 203/10/88 with 25/80/90; Sumatra-Andaman 2004 329/8/110 with 129/83/87
SELECT f, round(strike(auxiliary(f))) AS aux_strike, round(dip(auxiliary(f))) AS aux_dip,
       round(rake(auxiliary(f))) AS aux_rake, mechanism_class(f)
  FROM (VALUES ('203/10/88'::fault_slip), ('329/8/110')) t(f);

-- moment tensor for unit scalar moment, NED and up-south-east orders
SELECT moment_tensor('0/45/90') AS ned, moment_tensor('0/45/90', 'use') AS use,
       moment_tensor('0/90/0', 'NED') AS strike_slip;
SELECT pg_temp.err('SELECT moment_tensor(''0/45/90'', ''xyz'')');
-- a mechanism and its auxiliary plane have the same moment tensor
SELECT count(*) AS mismatches FROM generate_series(1, 300) g,
  LATERAL (SELECT fault_slip(g * 37 % 360, g * 13 % 89 + 1, g * 71 % 360 - 180) f) x,
  LATERAL (SELECT moment_tensor(f) a, moment_tensor(auxiliary(f)) b) m,
  LATERAL (SELECT max(abs(a[i] - b[i])) d FROM generate_series(1, 6) i) e
 WHERE d > 1e-9;

-- Kagan (1991) identities: a mechanism and its own auxiliary form are the same
-- double couple (0); thrust vs normal on the same planes is 90; at most 120 (the
-- four symmetries of a double couple; values against quaternions in check_kagan_numpy.py)
SELECT kagan_angle('30/60/40', auxiliary('30/60/40')) AS same_dc,
       kagan_angle('0/45/90', '0/45/-90') AS thrust_vs_normal,
       kagan_angle('0/90/0', '30/90/0') AS rotated_30;
SELECT count(*) AS n, max(k) <= 120 AS at_most_120,
       count(*) FILTER (WHERE abs(k - kagan_angle(b, a)) > 1e-7) AS asymmetric
  FROM generate_series(1, 500) g,
  LATERAL (SELECT fault_slip(g * 37 % 360, g * 13 % 91, g * 71 % 361 - 180) a,
                  fault_slip(g * 59 % 360, g * 29 % 91, g * 43 % 361 - 180) b) x,
  LATERAL (SELECT kagan_angle(a, b) k) y;

-- mechanism classes (Frohlich 1992 thresholds, from memory)
SELECT f, mechanism_class(f), plunge(p_axis(f)) AS p_pl, plunge(t_axis(f)) AS t_pl, plunge(b_axis(f)) AS b_pl
  FROM (VALUES ('0/70/30'::fault_slip), ('0/60/45'), ('0/60/-45'), ('45/80/170')) t(f);
