-- The columns of a per-domain stress result, shared by the demo (demo/domains.sql) and
-- scripts/analyse-csv.sh, so both write the same table: helper functions in pg_temp
-- (nothing is left in the database). Plain SQL, no psql commands: psql reads it with
-- \i, scripts/report/analyse_csv.py sends it as it is.
--
-- pg_temp.domain_columns(t): the principal axes as trend and plunge with their 95 %
-- bootstrap cone half-angles, Phi with its interval, SHmax azimuth, regime, A-phi
-- (regime_index) and mean misfit of a tensor, rounded for a table (angles to 0.1
-- degree, Phi to 0.001, A-phi to 0.01). All NULL for a NULL tensor (a domain with too
-- few data); a cone or interval is NULL where the tensor has none.
CREATE FUNCTION pg_temp.domain_columns(t stress_tensor,
    OUT sigma1_trend numeric, OUT sigma1_plunge numeric, OUT sigma1_cone95 numeric,
    OUT sigma2_trend numeric, OUT sigma2_plunge numeric, OUT sigma2_cone95 numeric,
    OUT sigma3_trend numeric, OUT sigma3_plunge numeric, OUT sigma3_cone95 numeric,
    OUT shape_ratio numeric, OUT shape_ratio_low numeric, OUT shape_ratio_high numeric,
    OUT shmax_azimuth numeric, OUT regime text, OUT regime_index numeric, OUT mean_misfit numeric)
LANGUAGE sql IMMUTABLE STRICT AS $$
  SELECT round(trend(sigma1(t))::numeric, 1), round(plunge(sigma1(t))::numeric, 1),
         round(sigma1_confidence(t)::numeric, 1),
         round(trend(sigma2(t))::numeric, 1), round(plunge(sigma2(t))::numeric, 1),
         round(sigma2_confidence(t)::numeric, 1),
         round(trend(sigma3(t))::numeric, 1), round(plunge(sigma3(t))::numeric, 1),
         round(sigma3_confidence(t)::numeric, 1),
         round(shape_ratio(t)::numeric, 3), round((shape_ratio_interval(t))[1]::numeric, 3),
         round((shape_ratio_interval(t))[2]::numeric, 3),
         round(shmax_azimuth(t)::numeric, 1), stress_regime(t), round(regime_index(t)::numeric, 2),
         round(mean_misfit(t)::numeric, 1)
$$;

-- pg_temp.mean_position(x, y, z): the longitude and latitude (WGS 84 degrees, 5
-- decimals, about 1 m) of the mean of unit vectors whose components are averaged in
-- x = avg(cosd(lat) * cosd(lon)), y = avg(cosd(lat) * sind(lon)), z = avg(sind(lat)):
-- the centre of a group of points, right across the antimeridian too. NULL when the
-- mean vanishes (points spread around the globe) or no point has coordinates.
CREATE FUNCTION pg_temp.mean_position(x float8, y float8, z float8, OUT lon numeric, OUT lat numeric)
LANGUAGE sql IMMUTABLE STRICT AS $$
  SELECT round(atan2d(y, x)::numeric, 5), round(atan2d(z, sqrt(x * x + y * y))::numeric, 5)
   WHERE sqrt(x * x + y * y + z * z) > 1e-9
$$;
