-- A site's field faults in the display of Hoeppener (1955): an arrow through
-- each pole in the direction of hanging-wall slip, with the stress axes of the
-- main phase (see fault_net.sql). psql variables: site. Output: one SVG document.
WITH ph AS (SELECT stress_phases(fault, 2, 20261) AS p FROM fault_slip_obs WHERE site = :'site'),
     main AS (SELECT o.fault FROM fault_slip_obs o, ph WHERE o.site = :'site' AND stress_phase(o.fault, ph.p) = 1)
SELECT net_svg(net_label(net_hoeppener(fault), 'field faults')
               || net_label(net_stress((SELECT stress_inversion(fault, 500, 20261) FROM main)), 'main phase'),
               title => :'site' || ': faults after Hoeppener (1955)')
  FROM fault_slip_obs WHERE site = :'site';
