// Unit tests of src/core/figure and render: stored forms round-trip and are
// checked, items sort, limits hold, documents are deterministic and carry one
// path per drawn datum.
#include "contour.hpp"
#include "figure.hpp"
#include "render.hpp"
#include "stress.hpp"

#include <gtest/gtest.h>

#include <cstdlib>
#include <string>

using namespace striae;

namespace {

Figure sample() {
  Figure f;
  f.layers.push_back(Layer{LayerKind::Poles, "bedding \xc2\xb1", {}, {200, 40, 20, 26}});
  f.layers.push_back(Layer{LayerKind::SlipPlanes, "", {}, {110, 64, -75, 30, 60, 40}});
  const StressTensor t = stress_from_axes(Line{105, 6}, Line{285, 84}, 0.4);
  const double *c = &t.nn;
  Layer s{LayerKind::Stress, "", std::vector<double>(c, c + 13), {}};
  s.params.push_back(0);
  s.params.push_back(0);
  f.layers.push_back(s);
  return f;
}

size_t count(const std::string &s, const std::string &what) {
  size_t n = 0;
  for (size_t at = s.find(what); at != std::string::npos; at = s.find(what, at + 1)) ++n;
  return n;
}

}  // namespace

TEST(Figure, TextAndBytesRoundTrip) {
  const Figure f = sample();
  const std::string text = figure_to_text(f);
  EXPECT_EQ(figure_to_text(figure_from_text(text.c_str())), text);
  const std::string bytes = encode_figure(f);
  EXPECT_EQ(encode_figure(decode_figure(bytes.data(), bytes.size())), bytes);
  EXPECT_EQ(text.substr(0, 61), "{\"layers\": [{\"kind\": \"poles\", \"label\": \"bedding \xc2\xb1\", \"params\"");
  // every truncation and a trailing byte are rejected, never read past the end
  for (size_t k = 0; k < bytes.size(); ++k) EXPECT_THROW(decode_figure(bytes.data(), k), Error) << k;
  const std::string longer = bytes + "x";
  EXPECT_THROW(decode_figure(longer.data(), longer.size()), Error);
  std::string bad = bytes;
  bad[3] = 2;  // version byte
  EXPECT_THROW(decode_figure(bad.data(), bad.size()), Error);
}

TEST(Figure, ChecksAndLimits) {
  Figure f;
  f.layers.push_back(Layer{LayerKind::Lines, "", {}, {300, -30}});  // not canonical
  EXPECT_THROW(check_figure(f), Error);
  f.layers[0].data = {120, 30};
  EXPECT_NO_THROW(check_figure(f));
  f.layers[0].label = "a\nb";
  EXPECT_THROW(check_figure(f), Error);
  f.layers[0].label = "\xc3\x28";  // invalid UTF-8
  EXPECT_THROW(check_figure(f), Error);
  f.layers[0].label = "";
  Figure many;
  for (size_t i = 0; i < kMaxFigureLayers; ++i) many.layers.push_back(f.layers[0]);
  EXPECT_NO_THROW(check_figure(many));
  EXPECT_THROW(concat_figures(many, f), Error);
  Layer big{LayerKind::Poles, "", {}, std::vector<double>(2 * (kMaxFigureItems + 1), 0.0)};
  for (size_t i = 0; i < big.data.size(); i += 2) big.data[i + 1] = 10;
  Figure fb;
  fb.layers.push_back(big);
  EXPECT_THROW(check_figure(fb), Error);
}

TEST(Figure, SortItems) {
  Layer l{LayerKind::SlipPlanes, "", {}, {30, 60, 40, 10, 20, 30, 30, 50, 1}};
  sort_items(l);
  EXPECT_EQ(l.data, (std::vector<double>{10, 20, 30, 30, 50, 1, 30, 60, 40}));
}

TEST(Render, DeterministicWithOnePathPerDatum) {
  const Figure f = sample();
  RenderOptions o;
  o.title = "A & B";
  const std::string a = render_svg(f, o), b = render_svg(f, o);
  EXPECT_EQ(a, b);
  EXPECT_EQ(a.rfind("<?xml", 0), 0u);
  EXPECT_NE(a.find("<title>A &amp; B</title>"), std::string::npos);
  // 2 poles, 2 faults: each a <path d= inside its group
  const size_t poles = a.find("class=\"poles\""), faults = a.find("class=\"slip_planes\"");
  ASSERT_NE(poles, std::string::npos);
  ASSERT_NE(faults, std::string::npos);
  EXPECT_EQ(count(a.substr(poles, a.find("</g>", poles) - poles), "<path d="), 2u);
  EXPECT_EQ(count(a.substr(faults, a.find("</g>", faults) - faults), "<path d="), 2u);
  // legend names the stress axes and the label, as numeric references
  EXPECT_NE(a.find("&#963;1 105/06"), std::string::npos);
  EXPECT_NE(a.find("bedding &#177;: n = 2"), std::string::npos);
  for (unsigned char c : a) EXPECT_LT(c, 0x80);
  o.size = 100;
  EXPECT_THROW(render_svg(f, o), Error);
}

TEST(Figure, LabelAndConeLimits) {
  // figure.hpp: a label is at most kMaxLabelBytes (200) bytes; a cone's half-angle
  // is 0 < h <= 90. Both sides of each limit.
  Figure f;
  f.layers.push_back(Layer{LayerKind::Lines, std::string(kMaxLabelBytes, 'a'), {}, {120, 30}});
  EXPECT_NO_THROW(check_figure(f));
  f.layers[0].label += "a";
  EXPECT_THROW(check_figure(f), Error);
  f.layers[0].label = std::string(kMaxLabelBytes - 1, 'a') + "\xc2\xb1";  // 201 bytes, 200 characters
  EXPECT_THROW(check_figure(f), Error);
  for (double h : {90.0, 0.5, 1e-9}) {
    Figure c;
    c.layers.push_back(Layer{LayerKind::Cones, "", {}, {120, 30, h}});
    EXPECT_NO_THROW(check_figure(c)) << h;
  }
  for (double h : {0.0, -1.0, 90.5}) {
    Figure c;
    c.layers.push_back(Layer{LayerKind::Cones, "", {}, {120, 30, h}});
    EXPECT_THROW(check_figure(c), Error) << h;
  }
}

namespace {

// Relative move (dx, dy) of the first 'l' after the k-th 'M' from the end of an
// SVG path's d attribute (hundredths of a pixel written as decimals).
std::pair<double, double> move_after(const std::string &d, int from_end) {
  size_t at = std::string::npos;
  for (int k = 0; k < from_end; ++k) at = d.rfind('M', at == std::string::npos ? at : at - 1);
  const size_t l = d.find('l', at);
  char *end;
  const double dx = std::strtod(d.c_str() + l + 1, &end);
  const double dy = std::strtod(end, nullptr);
  return {dx, dy};
}

}  // namespace

TEST(Render, SlipArrowsPointTheWayTheHangingWallMoves) {
  // README (net_slip_planes): the arrow on a fault's great circle points the way
  // the hanging wall moves in map view. A fault striking 000 and dipping 60 east:
  // normal slip (rake -90) moves the hanging wall down the dip, east (+x in the
  // picture); reverse slip (rake 90) west; sinistral strike slip on a fault
  // striking 090 (rake 0) moves it along the strike, east; dextral (rake 180)
  // west (Aki & Richards convention, METHODS.md section 1). The arrow is the last
  // two pieces of the datum's path: the shaft from tail to tip, then the head.
  struct Case { double strike, dip, rake; int sign; };
  for (const Case &c : {Case{0, 60, -90, 1}, Case{0, 60, 90, -1}, Case{90, 60, 0, 1}, Case{90, 60, 180, -1}}) {
    Figure f;
    f.layers.push_back(Layer{LayerKind::SlipPlanes, "", {}, {c.strike, c.dip, c.rake}});
    const std::string svg = render_svg(f, RenderOptions{});
    const size_t g = svg.find("class=\"slip_planes\"");
    ASSERT_NE(g, std::string::npos);
    const size_t d0 = svg.find(" d=\"", svg.find("<path", g)) + 4;
    const std::string d = svg.substr(d0, svg.find('"', d0) - d0);
    const auto shaft = move_after(d, 2);
    EXPECT_GT(c.sign * shaft.first, 0) << c.strike << "/" << c.dip << "/" << c.rake << ": " << d;
    EXPECT_LT(std::fabs(shaft.second), 1e-9 + 0.02 * std::fabs(shaft.first));  // east-west
  }
}

TEST(Render, NetFrameHasOneMarginAllRound) {
  // Layout rule of render.cpp (striae's design, no source): the primitive circle
  // is centred across the width with the same margin left, right and above (no
  // title), a margin of at least 2.2 em so that the N label and the ticks fit.
  for (int size : {120, 321, 480, 1000, 4000}) {
    RenderOptions o;
    o.size = size;
    o.legend = false;
    const NetFrame fr = net_frame(Figure{}, o);
    const double left = fr.cx - fr.radius, right = fr.width - fr.cx - fr.radius, top = fr.cy - fr.radius;
    EXPECT_NEAR(left, right, 1e-9) << size;
    EXPECT_NEAR(left, top, 1e-9) << size;
    EXPECT_GE(left, 2.2 * fr.font - 1e-9) << size;
    EXPECT_NEAR(fr.height - fr.cy - fr.radius, left, 1e-9 + 1.0) << size;  // below, up to the whole-pixel height
  }
}

TEST(Contour, InterpolationAndAutomaticLevels) {
  // contour.hpp: linear in trend along a ring, then linear in plunge. At spacing
  // 45 the horizontal half-ring has nodes at trends 0, 45, 90, 135 (grid.hpp
  // layout), the ring at plunge 45 six nodes 60 degrees apart, then the vertical
  // node. Values 10 k at node k: on the horizon at trend 33.75, a quarter of the
  // way back from node 1, the value is 0.25 v0 + 0.75 v1 = 7.5; at trend 157.5
  // between node 3 and node 0 seen from the other end (the half-ring is axial)
  // 0.5 (30 + 0) = 15; straight down, the vertical node's value (derived).
  const int count = grid_node_count(45);
  ASSERT_EQ(count, 4 + 6 + 1);
  std::vector<double> v(count);
  for (int k = 0; k < count; ++k) v[k] = 10.0 * k;
  EXPECT_NEAR(grid_value_at(45, v.data(), v.size(), line_vector(Line{33.75, 0})), 7.5, 1e-9);
  EXPECT_NEAR(grid_value_at(45, v.data(), v.size(), line_vector(Line{157.5, 0})), 15.0, 1e-9);
  EXPECT_NEAR(grid_value_at(45, v.data(), v.size(), line_vector(Line{0, 90})), 100.0, 1e-9);
  // plunge 22.5 at trend 0: halfway between node 0 (0) and node 4 (40): 20
  EXPECT_NEAR(grid_value_at(45, v.data(), v.size(), line_vector(Line{0, 22.5})), 20.0, 1e-9);
  // automatic levels (contour.hpp, README net_contours)
  EXPECT_EQ(auto_levels(GridKind::RightDihedra, v.data(), v.size()), (std::vector<double>{20, 40, 60, 80, 100}));
  const double dens[3] = {0.2, 3.7, 1.0};
  EXPECT_EQ(auto_levels(GridKind::Density, dens, 3), (std::vector<double>{1, 2, 3}));
  const double dens2[2] = {0.1, 2.4};
  EXPECT_EQ(auto_levels(GridKind::Density, dens2, 2), (std::vector<double>{0.5, 1, 1.5, 2}));
}
