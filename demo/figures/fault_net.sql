-- Net of a site's field faults (great circles with hanging-wall slip arrows)
-- with the stress of its main phase: stress_phases separates the two phases of
-- the district (demo/README.md), and the faults of the larger one are
-- inverted with 500 bootstrap resamples (axes, 95 % cones, SHmax).
-- psql variables: site. Output: one SVG document.
WITH ph AS (SELECT stress_phases(fault, 2, 20261) AS p FROM fault_slip_obs WHERE site = :'site'),
     main AS (SELECT o.fault FROM fault_slip_obs o, ph WHERE o.site = :'site' AND stress_phase(o.fault, ph.p) = 1)
SELECT net_svg(net_label(net_faults(fault), 'field faults')
               || net_label(net_stress((SELECT stress_inversion(fault, 500, 20261) FROM main)), 'main phase'),
               title => :'site' || ': field faults and stress', graticule => true)
  FROM fault_slip_obs WHERE site = :'site';
