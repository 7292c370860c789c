-- A site's field faults in the display of Hoeppener (1955): an arrow through
-- each pole in the direction of hanging-wall slip, with the stress axes.
-- psql variables: site. Output: one SVG document.
SELECT net_svg(net_label(net_hoeppener(fault), 'field faults')
               || net_stress(stress_inversion(fault, 500, 20261)),
               title => :'site' || ': faults after Hoeppener (1955)')
  FROM fault_slip_obs WHERE site = :'site';
