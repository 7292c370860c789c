// A small SVG 1.1 writer: fixed decimal precision (hundredths of a pixel, so
// output is the same to the byte on every machine), escaped text, and disc
// paths (drawing.hpp) scaled to pixels. Everything goes into one std::string.
#pragma once

#include "drawing.hpp"

#include <cstdint>
#include <string>

namespace striae {

class SvgWriter {
 public:
  // Disc -> pixels: X = cx + r x, Y = cy - r y (north up, east right).
  double cx = 0, cy = 0, r = 1;
  std::string out;

  SvgWriter &raw(const char *s) {
    out += s;
    return *this;
  }
  SvgWriter &raw(const std::string &s) {
    out += s;
    return *this;
  }
  // A number rounded to hundredths, trailing zeros dropped ("12.5", "-3", "0.07").
  SvgWriter &num(double v);
  // Text content or attribute value: & < > " ' escaped, characters beyond ASCII
  // written as numeric character references (so the document is plain ASCII
  // whatever the database encoding), control characters as blanks. The input is
  // UTF-8 (invalid sequences are written as U+FFFD).
  SvgWriter &text(const std::string &utf8);
  // Pixel position of a disc point.
  double px(const XY &p) const { return cx + r * p.x; }
  double py(const XY &p) const { return cy - r * p.y; }
  // The d attribute's value for a disc path: absolute moveto, relative
  // segments computed from coordinates already rounded to hundredths (so no
  // error accumulates), arcs of the primitive as SVG elliptical arcs.
  SvgWriter &path_data(const DiscPath &path);
  // d for a closed polyline in pixel coordinates (rounded likewise).
  SvgWriter &polyline_data(const double *xy, size_t points, bool close);

 private:
  int64_t cur_x_ = 0, cur_y_ = 0, start_x_ = 0, start_y_ = 0;
  void hundredths(int64_t v);
  void rel(int64_t x, int64_t y);
};

// Round a pixel coordinate to hundredths (ties away from zero).
int64_t to_hundredths(double v);

}  // namespace striae
