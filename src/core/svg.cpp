// SVG writer (see svg.hpp).
#include "svg.hpp"

#include <cmath>

namespace striae {

int64_t to_hundredths(double v) {
  if (!std::isfinite(v) || std::fabs(v) > 1e12) throw Error(ErrorKind::DataError, "figure coordinate out of range");
  return static_cast<int64_t>(std::llround(v * 100.0));
}

void SvgWriter::hundredths(int64_t v) {
  char buf[32];
  int n = 0;
  const bool neg = v < 0;
  uint64_t a = neg ? static_cast<uint64_t>(-v) : static_cast<uint64_t>(v);
  const unsigned frac = static_cast<unsigned>(a % 100);
  a /= 100;
  char digits[24];
  int d = 0;
  do {
    digits[d++] = static_cast<char>('0' + a % 10);
    a /= 10;
  } while (a);
  if (neg && (d > 1 || digits[0] != '0' || frac)) buf[n++] = '-';
  while (d) buf[n++] = digits[--d];
  if (frac) {
    buf[n++] = '.';
    buf[n++] = static_cast<char>('0' + frac / 10);
    if (frac % 10) buf[n++] = static_cast<char>('0' + frac % 10);
  }
  out.append(buf, n);
}

SvgWriter &SvgWriter::num(double v) {
  hundredths(to_hundredths(v));
  return *this;
}

SvgWriter &SvgWriter::text(const std::string &s) {
  const unsigned char *p = reinterpret_cast<const unsigned char *>(s.data());
  const unsigned char *end = p + s.size();
  while (p < end) {
    unsigned c = *p;
    uint32_t cp;
    int len;
    if (c < 0x80) {
      cp = c;
      len = 1;
    } else if ((c & 0xE0) == 0xC0) {
      cp = c & 0x1F;
      len = 2;
    } else if ((c & 0xF0) == 0xE0) {
      cp = c & 0x0F;
      len = 3;
    } else if ((c & 0xF8) == 0xF0) {
      cp = c & 0x07;
      len = 4;
    } else {
      cp = 0xFFFD;
      len = 1;
    }
    if (len > 1) {
      bool ok = end - p >= len;
      for (int k = 1; ok && k < len; ++k) {
        if ((p[k] & 0xC0) != 0x80) ok = false;
        else cp = (cp << 6) | (p[k] & 0x3F);
      }
      if (!ok || cp > 0x10FFFF || (cp >= 0xD800 && cp <= 0xDFFF)) {
        cp = 0xFFFD;
        len = 1;
      }
    }
    p += len;
    switch (cp) {
      case '&': out += "&amp;"; continue;
      case '<': out += "&lt;"; continue;
      case '>': out += "&gt;"; continue;
      case '"': out += "&quot;"; continue;
      case '\'': out += "&#39;"; continue;
      default: break;
    }
    if (cp < 0x20 || cp == 0x7F || cp == 0xFFFE || cp == 0xFFFF) {
      out += ' ';
    } else if (cp < 0x80) {
      out += static_cast<char>(cp);
    } else {
      out += "&#";
      out += std::to_string(cp);
      out += ';';
    }
  }
  return *this;
}

void SvgWriter::rel(int64_t x, int64_t y) {
  hundredths(x - cur_x_);
  if (y - cur_y_ >= 0) out += ' ';
  hundredths(y - cur_y_);
  cur_x_ = x;
  cur_y_ = y;
}

SvgWriter &SvgWriter::path_data(const DiscPath &path) {
  char last = 0;
  for (const PathSeg &s : path) {
    switch (s.op) {
      case PathSeg::Move: {
        const int64_t x = to_hundredths(px(s.p[0])), y = to_hundredths(py(s.p[0]));
        out += 'M';
        hundredths(x);
        out += ' ';
        hundredths(y);
        cur_x_ = start_x_ = x;
        cur_y_ = start_y_ = y;
        last = 'M';
        break;
      }
      case PathSeg::Line: {
        const int64_t x = to_hundredths(px(s.p[0])), y = to_hundredths(py(s.p[0]));
        if (last != 'l') out += 'l';
        else if (x - cur_x_ >= 0) out += ' ';
        rel(x, y);
        last = 'l';
        break;
      }
      case PathSeg::Cubic: {
        // Control points relative to the segment's start (SVG's c).
        const int64_t x0 = cur_x_, y0 = cur_y_;
        int64_t v[6];
        for (int k = 0; k < 3; ++k) {
          v[2 * k] = to_hundredths(px(s.p[k])) - x0;
          v[2 * k + 1] = to_hundredths(py(s.p[k])) - y0;
        }
        if (last != 'c') out += 'c';
        else if (v[0] >= 0) out += ' ';
        for (int k = 0; k < 6; ++k) {
          if (k && v[k] >= 0) out += ' ';
          hundredths(v[k]);
        }
        cur_x_ = x0 + v[4];
        cur_y_ = y0 + v[5];
        last = 'c';
        break;
      }
      case PathSeg::Rim: {
        const int64_t x = to_hundredths(px(s.p[0])), y = to_hundredths(py(s.p[0]));
        // Counter-clockwise in the disc (y north) is counter-clockwise on
        // screen too, which in SVG's y-down frame is the negative-angle
        // direction: sweep flag 0.
        out += 'A';
        num(r);
        out += ' ';
        num(r);
        out += s.sweep > 0 ? " 0 0 0 " : " 0 0 1 ";
        hundredths(x);
        out += ' ';
        hundredths(y);
        cur_x_ = x;
        cur_y_ = y;
        last = 'A';
        break;
      }
      case PathSeg::CircleArc: {
        const int64_t x = to_hundredths(px(s.p[0])), y = to_hundredths(py(s.p[0]));
        out += 'A';
        num(r * s.p[2].x);
        out += ' ';
        num(r * s.p[2].x);
        out += s.p[2].y > 0 ? " 0 1 " : " 0 0 ";
        out += s.sweep > 0 ? "0 " : "1 ";  // counter-clockwise in the disc: flag 0 (see Rim)
        hundredths(x);
        out += ' ';
        hundredths(y);
        cur_x_ = x;
        cur_y_ = y;
        last = 'A';
        break;
      }
      case PathSeg::Close:
        out += 'z';
        cur_x_ = start_x_;
        cur_y_ = start_y_;
        last = 'z';
        break;
    }
  }
  return *this;
}

SvgWriter &SvgWriter::polyline_data(const double *xy, size_t points, bool close) {
  if (points == 0) return *this;
  const int64_t x0 = to_hundredths(xy[0]), y0 = to_hundredths(xy[1]);
  out += 'M';
  hundredths(x0);
  out += ' ';
  hundredths(y0);
  cur_x_ = start_x_ = x0;
  cur_y_ = start_y_ = y0;
  bool first = true;
  for (size_t i = 1; i < points; ++i) {
    const int64_t x = to_hundredths(xy[2 * i]), y = to_hundredths(xy[2 * i + 1]);
    if (x == cur_x_ && y == cur_y_) continue;
    if (first) out += 'l';
    else if (x - cur_x_ >= 0) out += ' ';
    first = false;
    rel(x, y);
  }
  if (close) {
    out += 'z';
    cur_x_ = start_x_;
    cur_y_ = start_y_;
  }
  return *this;
}

}  // namespace striae
