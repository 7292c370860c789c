-- Right-dihedra grid of a site's field faults as filled bands, with the
-- stress axes of its main phase (see fault_net.sql) on top.
-- psql variables: site. Output: one SVG document.
WITH ph AS (SELECT stress_phases(fault, 2, 20261) AS p FROM fault_slip_obs WHERE site = :'site'),
     main AS (SELECT o.fault FROM fault_slip_obs o, ph WHERE o.site = :'site' AND stress_phase(o.fault, ph.p) = 1)
SELECT net_svg(net_contours(right_dihedra(fault, 2.5))
               || net_label(net_stress((SELECT stress_inversion(fault, 500, 20261) FROM main)), 'main phase'),
               title => :'site' || ': right dihedra and stress')
  FROM fault_slip_obs WHERE site = :'site';
