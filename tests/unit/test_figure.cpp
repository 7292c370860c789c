// Unit tests of src/core/figure and render: stored forms round-trip and are
// checked, items sort, limits hold, documents are deterministic and carry one
// path per drawn datum.
#include "figure.hpp"
#include "render.hpp"
#include "stress.hpp"

#include <gtest/gtest.h>

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
