-- Focal-sphere diagram of one mechanism. psql variables: event. Output: one SVG.
SELECT net_svg(net_label(net_mechanism(mechanism), event_id), size => 240, title => event_id || ' (' || site || ')')
  FROM focal_event WHERE event_id = :'event';
