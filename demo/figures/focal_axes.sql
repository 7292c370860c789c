-- P and T axes of a site's focal mechanisms with the stress of the joint focal
-- inversion. psql variables: site. Output: one SVG document.
SELECT net_svg(net_label(net_pt_axes(mechanism), 'mechanisms')
               || net_label(net_stress(focal_stress_inversion(mechanism, NULL, 200, 20261)), 'joint focal inversion'),
               title => :'site' || ': focal mechanisms and stress', graticule => true)
  FROM focal_event WHERE site = :'site';
