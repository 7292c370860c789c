-- Focal-mechanism geometry of fault_slip values (one nodal plane with its rake).

CREATE FUNCTION auxiliary(fault_slip) RETURNS fault_slip
  AS 'MODULE_PATHNAME', 'fault_slip_auxiliary' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION auxiliary(fault_slip) IS
  'the other nodal plane of the double couple with its rake (normal and slip vectors swapped)';
CREATE FUNCTION auxiliary_plane(fault_slip) RETURNS plane
  AS 'MODULE_PATHNAME', 'fault_slip_auxiliary_plane' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION auxiliary_plane(fault_slip) IS 'the other nodal plane of the double couple';
CREATE FUNCTION p_axis(fault_slip) RETURNS lineation
  AS 'MODULE_PATHNAME', 'fault_slip_p_axis' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION p_axis(fault_slip) IS 'pressure axis (n - u)/sqrt 2 of the double couple, lower hemisphere';
CREATE FUNCTION t_axis(fault_slip) RETURNS lineation
  AS 'MODULE_PATHNAME', 'fault_slip_t_axis' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION t_axis(fault_slip) IS 'tension axis (n + u)/sqrt 2 of the double couple, lower hemisphere';
CREATE FUNCTION b_axis(fault_slip) RETURNS lineation
  AS 'MODULE_PATHNAME', 'fault_slip_b_axis' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION b_axis(fault_slip) IS 'null axis T x P of the double couple, lower hemisphere';
CREATE FUNCTION moment_tensor(fault_slip, frame text DEFAULT 'ned') RETURNS float8[]
  AS 'MODULE_PATHNAME', 'fault_slip_moment_tensor' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION moment_tensor(fault_slip, text) IS
  'double-couple moment tensor for unit scalar moment, M = n u^T + u n^T; frame ''ned'' gives {nn, ee, dd, ne, nd, ed}, ''use'' gives {rr, tt, pp, rt, rp, tp} (up, south, east)';
CREATE FUNCTION kagan_angle(fault_slip, fault_slip) RETURNS float8
  AS 'MODULE_PATHNAME', 'fault_slip_kagan_angle' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION kagan_angle(fault_slip, fault_slip) IS
  'Kagan (1991) angle: smallest rotation between two double couples, degrees 0..120';
CREATE FUNCTION mechanism_class(fault_slip) RETURNS text
  AS 'MODULE_PATHNAME', 'fault_slip_mechanism_class' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION mechanism_class(fault_slip) IS
  'mechanism class from the plunges of the T, B and P axes after Frohlich (1992, PEPI 75:193; thresholds recalled from memory, not checked against the paper): thrust (T > 50), strike-slip (B > 60), normal (P > 60), else unclassified; the same words as stress_regime';
