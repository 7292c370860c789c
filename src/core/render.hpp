// Rendering a figure (figure.hpp) to a standalone SVG 1.1 document: a pure
// function of the layers and the options, the same bytes on every run.
//
// Layout: the net (lower hemisphere, north up, east right) in a square of the
// given width, an optional title above it, the legend below it (one line per
// layer, more for stress and contour layers). Layers are painted in a fixed
// order of kinds (contour bands, P dihedra, focal-sphere diagrams and cones
// first; then the graticule; great circles and fault-slip arrows; the
// primitive; point symbols; stress axes last) and, within a kind, in the
// figure's order. Every drawn datum is one <path> element inside its layer's
// <g id="layer-K" class="KIND"> (pt_axes layers have two such groups, one for
// P and one for T).
//
// Palette: Okabe & Ito (2008, "Color universal design"), safe for the common
// colour-vision deficiencies: data layers take blue #0072B2, vermillion
// #D55E00, bluish green #009E73, reddish purple #CC79A7, orange #E69F00 and sky
// blue #56B4E9 in turn (from vermillion when the figure has filled contour
// bands, which are blue; P dihedra are always vermillion); stress axes are vermillion (sigma1), yellow (sigma2)
// and sky blue (sigma3) with black outlines; contour bands run from white
// through sky blue to blue and a dark blue, light to dark, so they read in
// grey too.
#pragma once

#include "figure.hpp"
#include "projection.hpp"

#include <string>

namespace striae {

struct RenderOptions {
  Projection projection = Projection::EqualArea;
  int size = 480;           // width in pixels (CSS px); the height follows the legend
  std::string title;        // empty: no title line (the <title> element names the projection)
  bool graticule = false;   // 10-degree rings of plunge and spokes of trend
  bool legend = true;
};
constexpr int kMinFigureSize = 120;
constexpr int kMaxFigureSize = 4000;

// InvalidParameter for a size outside [kMinFigureSize, kMaxFigureSize] or a
// title that check_label rejects; the figure must be valid (check_figure).
std::string render_svg(const Figure &f, const RenderOptions &o);

// Pixel geometry of the net for a figure and options (the same numbers
// render_svg uses): centre and radius of the primitive circle.
struct NetFrame {
  double width, height, cx, cy, radius, font;
};
NetFrame net_frame(const Figure &f, const RenderOptions &o);

}  // namespace striae
