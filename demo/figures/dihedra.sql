-- Right dihedra of a site's field faults: each fault's P dihedron overlaid
-- (translucent, the hand method) beneath the contour lines of the
-- right-dihedra grid (percent of faults with a P dihedron there).
-- psql variables: site. Output: one SVG document.
SELECT net_svg(net_dihedra(fault) || net_contours(right_dihedra(fault, 2.5), NULL, false),
               title => :'site' || ': right dihedra of the field faults')
  FROM fault_slip_obs WHERE site = :'site';
