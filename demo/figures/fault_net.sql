-- Net of a site's field faults (great circles with hanging-wall slip arrows)
-- with the stress tensor inverted from them (axes, 95 % bootstrap cones, SHmax).
-- psql variables: site. Output: one SVG document.
SELECT net_svg(net_label(net_faults(fault), 'field faults')
               || net_label(net_stress(stress_inversion(fault, 500, 20261)), 'Michael inversion'),
               title => :'site' || ': field faults and stress', graticule => true)
  FROM fault_slip_obs WHERE site = :'site';
