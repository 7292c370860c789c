-- Bedding poles of a site over their density contours, with the lineations and
-- the mean lineation's alpha95 cone. psql variables: site. Output: one SVG.
SELECT net_svg(net_contours(density_grid(b.bedding, 2.5)) || net_label(net_poles(b.bedding), 'bedding')
               || (SELECT net_label(net_lines(lineation), 'lineations')
                          || net_label(net_cone((fisher_mean(lineation)).mean, (fisher_mean(lineation)).alpha95), 'mean lineation, alpha95')
                     FROM lineation_obs WHERE site = :'site'),
               title => :'site' || ': bedding and lineations')
  FROM bedding b WHERE b.site = :'site';
