-- Right-dihedra grid of a site's field faults as filled bands, with the
-- stress axes of the inversion on top. psql variables: site. Output: one SVG.
SELECT net_svg(net_contours(right_dihedra(fault, 2.5))
               || net_stress(stress_inversion(fault, 500, 20261)),
               title => :'site' || ': right dihedra and stress')
  FROM fault_slip_obs WHERE site = :'site';
