// The figure model: a figure is an ordered list of layers, each a kind, a
// label and its data in direction space (strike/dip, trend/plunge,
// strike/dip/rake, a stress tensor, a grid), never projected coordinates, so
// the same value renders in either projection and at any size. Rendering is a
// pure function of the layers and the options (render.hpp). This file holds the
// model, its limits, its checks and its two stored forms (portable bytes for
// storage and binary I/O, JSON-shaped text for text I/O).
#pragma once

#include "orientation.hpp"

#include <cstdint>
#include <string>
#include <vector>

namespace striae {

enum class LayerKind : uint8_t {
  GreatCircles = 1,  // planes as great circles; item strike, dip
  Poles = 2,         // planes as poles; item strike, dip
  Lines = 3,         // lineations as points; item trend, plunge
  SlipPlanes = 4,    // fault-slip data: great circle, arrow at the striation; item strike, dip, rake
  SlipPoles = 5,     // fault-slip data: arrow through the pole (Hoeppener 1955); item strike, dip, rake
  PTAxes = 6,        // focal mechanisms as P and T axes; item strike, dip, rake
  Mechanism = 7,     // one focal-sphere diagram; exactly one item strike, dip, rake
  PDihedra = 8,      // each datum's P (compressional) dihedron, translucent; item strike, dip, rake
  Contours = 9,      // filled contour bands of a sphere_grid; params below, data = node values
  Stress = 10,       // a stress tensor's axes, cones and SHmax; params = the 15 stored fields
  Cones = 11,        // cones about axes; item trend, plunge, half-angle (0 < h <= 90)
};
constexpr int kLayerKindCount = 11;

// Text name of a kind ("great_circles", "poles", "lines", "slip_planes",
// "slip_poles", "pt_axes", "mechanism", "p_dihedra", "contours", "stress",
// "cones").
const char *layer_kind_name(LayerKind k);
// Numbers per data item (0 for kinds whose data are not items).
int layer_item_width(LayerKind k);

struct Layer {
  LayerKind kind;
  std::string label;           // UTF-8, at most kMaxLabelBytes, no control characters
  std::vector<double> params;  // Contours: grid kind (1 density, 2 right dihedra), spacing,
                               //   data count, style (1 filled bands, 0 lines), then
                               //   0..kMaxContourLevels increasing levels
                               //   (none: chosen when drawn); Stress: nn ee dd ne nd ed misfit
                               //   cone1 cone2 cone3 phi_lo phi_hi friction data_count flags
  std::vector<double> data;    // items, layer_item_width numbers each; Contours: node values
  size_t items() const;        // data items (a contour layer counts as one)
};

struct Figure {
  std::vector<Layer> layers;
};

// Limits of one figure value: they bound the stored size (about 2.4 MB of
// items plus at most one 0.5-degree grid of 1.3 MB per contour layer) and the
// drawing time.
constexpr size_t kMaxFigureLayers = 64;
constexpr size_t kMaxFigureItems = 100000;
constexpr size_t kMaxLabelBytes = 200;
constexpr size_t kMaxContourLevels = 20;

// DataError (or InvalidParameter for a label or the limits) unless the layer
// is well formed: known kind, canonical items (as the SQL types store them),
// exact number counts, a valid stress tensor or grid, increasing finite levels.
void check_layer(const Layer &l);
// Every layer, and the limits above.
void check_figure(const Figure &f);
// Label check alone: valid UTF-8, no control characters, at most kMaxLabelBytes.
void check_label(const std::string &label);

size_t figure_items(const Figure &f);

// Both layers lists, a's first; the limits are checked.
Figure concat_figures(const Figure &a, const Figure &b);

// Items of a data layer in lexicographic order of their numbers, so that a
// layer built by an aggregate depends only on the set of its data.
void sort_items(Layer &l);

// Portable bytes: "SNF" and a version byte (1), a big-endian uint32 layer
// count, then per layer: kind byte, uint32 label length, label bytes, uint32
// number of params, uint32 number of data, the params and data as big-endian
// IEEE doubles. decode checks everything (DataError) and returns a valid figure.
std::string encode_figure(const Figure &f);
Figure decode_figure(const char *bytes, size_t size);

// Text form, JSON-shaped (keys in this order on output, numbers shortest
// round-trip, labels JSON-escaped):
//   {"layers": [{"kind": "poles", "label": "bedding", "params": [], "data": [20, 26, 200, 40]}]}
// figure_from_text accepts the same (blanks anywhere between tokens, keys in
// this order) and checks the result; InvalidText for a malformed literal.
std::string figure_to_text(const Figure &f);
Figure figure_from_text(const char *text);

}  // namespace striae
