// The figure model: checks, portable bytes, text form (see figure.hpp).
#include "figure.hpp"

#include "grid.hpp"
#include "stress.hpp"

#include <algorithm>
#include <charconv>
#include <cmath>
#include <cstring>

namespace striae {

namespace {

struct KindInfo {
  const char *name;
  int width;
};
const KindInfo kKinds[kLayerKindCount + 1] = {
    {nullptr, 0},        {"great_circles", 2}, {"poles", 2},     {"lines", 2},
    {"slip_planes", 3},  {"slip_poles", 3},    {"pt_axes", 3},   {"mechanism", 3},
    {"p_dihedra", 3},    {"contours", 0},      {"stress", 0},    {"cones", 3},
};

bool known(LayerKind k) {
  const int i = static_cast<int>(k);
  return i >= 1 && i <= kLayerKindCount;
}

[[noreturn]] void bad(const std::string &msg, const std::string &detail = {}) {
  throw Error(ErrorKind::DataError, msg, detail);
}

constexpr int kStressParams = 15;

}  // namespace

const char *layer_kind_name(LayerKind k) { return known(k) ? kKinds[static_cast<int>(k)].name : "unknown"; }
int layer_item_width(LayerKind k) { return known(k) ? kKinds[static_cast<int>(k)].width : 0; }

size_t Layer::items() const {
  const int w = layer_item_width(kind);
  if (w == 0) return 1;
  return data.size() / static_cast<size_t>(w);
}

size_t figure_items(const Figure &f) {
  size_t n = 0;
  for (const Layer &l : f.layers) n += l.items();
  return n;
}

void check_label(const std::string &s) {
  if (s.size() > kMaxLabelBytes)
    throw Error(ErrorKind::InvalidParameter, "figure label too long",
                "A label has at most " + std::to_string(kMaxLabelBytes) + " bytes.");
  const unsigned char *p = reinterpret_cast<const unsigned char *>(s.data()), *end = p + s.size();
  while (p < end) {
    const unsigned c = *p;
    int len = c < 0x80 ? 1 : (c & 0xE0) == 0xC0 ? 2 : (c & 0xF0) == 0xE0 ? 3 : (c & 0xF8) == 0xF0 ? 4 : 0;
    if (len == 0 || end - p < len) throw Error(ErrorKind::InvalidParameter, "figure label is not valid UTF-8");
    uint32_t cp = len == 1 ? c : c & (0x7F >> len);
    for (int k = 1; k < len; ++k) {
      if ((p[k] & 0xC0) != 0x80) throw Error(ErrorKind::InvalidParameter, "figure label is not valid UTF-8");
      cp = (cp << 6) | (p[k] & 0x3F);
    }
    const uint32_t min_cp[5] = {0, 0, 0x80, 0x800, 0x10000};
    if (cp < min_cp[len] || cp > 0x10FFFF || (cp >= 0xD800 && cp <= 0xDFFF))
      throw Error(ErrorKind::InvalidParameter, "figure label is not valid UTF-8");
    if (cp < 0x20 || cp == 0x7F || (cp >= 0x80 && cp < 0xA0) || cp == 0xFFFE || cp == 0xFFFF)
      throw Error(ErrorKind::InvalidParameter, "figure label contains a control character",
                  "Labels are one line of printable text.");
    p += len;
  }
}

void check_layer(const Layer &l) {
  if (!known(l.kind)) bad("unknown figure layer kind " + std::to_string(static_cast<int>(l.kind)));
  check_label(l.label);
  for (double v : l.params)
    if (!std::isfinite(v)) bad("figure layer parameters must be finite");
  for (double v : l.data)
    if (!std::isfinite(v)) bad("figure layer data must be finite");
  const std::string kind = layer_kind_name(l.kind);
  const int w = layer_item_width(l.kind);
  if (w > 0) {
    if (!l.params.empty()) bad("a " + kind + " layer has no parameters");
    if (l.data.size() % w) bad("a " + kind + " layer needs " + std::to_string(w) + " numbers per item");
    const size_t n = l.data.size() / w;
    if (l.kind == LayerKind::Mechanism && n != 1) bad("a mechanism layer holds exactly one focal mechanism");
    for (size_t i = 0; i < n; ++i) {
      const double *v = &l.data[i * w];
      bool ok;
      switch (l.kind) {
        case LayerKind::GreatCircles:
        case LayerKind::Poles: ok = is_canonical(Plane{v[0], v[1]}); break;
        case LayerKind::Lines: ok = is_canonical(Line{v[0], v[1]}); break;
        case LayerKind::Cones: ok = is_canonical(Line{v[0], v[1]}) && v[2] > 0 && v[2] <= 90; break;
        default: ok = is_canonical(FaultSlip{v[0], v[1], v[2]}); break;
      }
      if (!ok) bad("invalid item in a " + kind + " layer", "Items are canonical values as the SQL types store them.");
    }
    return;
  }
  if (l.kind == LayerKind::Stress) {
    if (l.params.size() != kStressParams || !l.data.empty()) bad("a stress layer holds the 15 fields of one stress_tensor");
    StressTensor t{};
    double *f = &t.nn;
    for (int k = 0; k < 13; ++k) f[k] = l.params[k];
    const double count = l.params[13], flags = l.params[14];
    if (count < 0 || count > 9.0e15 || count != std::floor(count) || flags < 0 || flags > 4294967295.0 ||
        flags != std::floor(flags))
      bad("invalid stress tensor in a stress layer");
    t.data_count = static_cast<int64_t>(count);
    t.flags = static_cast<uint32_t>(flags);
    t.version = kStressTensorVersion;
    check_stress_tensor(t);
    return;
  }
  // Contours
  if (l.params.size() < 4) bad("a contours layer needs grid kind, spacing, data count and style");
  const double gk = l.params[0];
  if (gk != 1 && gk != 2) bad("unknown grid kind in a contours layer");
  const double spacing = l.params[1], n = l.params[2];
  if (n < 0 || n > 9.0e15 || n != std::floor(n)) bad("invalid data count in a contours layer");
  check_grid(static_cast<GridKind>(static_cast<int>(gk)), spacing, static_cast<int64_t>(n), l.data.data(), l.data.size());
  if (l.params[3] != 0 && l.params[3] != 1) bad("contour style must be 1 (filled bands) or 0 (lines)");
  const size_t levels = l.params.size() - 4;
  if (levels > kMaxContourLevels)
    throw Error(ErrorKind::InvalidParameter, "too many contour levels",
                "At most " + std::to_string(kMaxContourLevels) + " levels.");
  for (size_t k = 1; k < levels; ++k)
    if (!(l.params[4 + k] > l.params[3 + k]))
      throw Error(ErrorKind::InvalidParameter, "contour levels must be strictly increasing");
}

void check_figure(const Figure &f) {
  if (f.layers.size() > kMaxFigureLayers)
    throw Error(ErrorKind::InvalidParameter, "too many layers in one figure",
                "A figure holds at most " + std::to_string(kMaxFigureLayers) + " layers.");
  for (const Layer &l : f.layers) check_layer(l);
  if (figure_items(f) > kMaxFigureItems)
    throw Error(ErrorKind::InvalidParameter, "too many data in one figure",
                "A figure holds at most " + std::to_string(kMaxFigureItems) + " drawn data.");
}

Figure concat_figures(const Figure &a, const Figure &b) {
  if (a.layers.size() + b.layers.size() > kMaxFigureLayers)
    throw Error(ErrorKind::InvalidParameter, "too many layers in one figure",
                "A figure holds at most " + std::to_string(kMaxFigureLayers) + " layers.");
  if (figure_items(a) + figure_items(b) > kMaxFigureItems)
    throw Error(ErrorKind::InvalidParameter, "too many data in one figure",
                "A figure holds at most " + std::to_string(kMaxFigureItems) + " drawn data.");
  Figure out = a;
  out.layers.insert(out.layers.end(), b.layers.begin(), b.layers.end());
  return out;
}

void sort_items(Layer &l) {
  const int w = layer_item_width(l.kind);
  if (w == 0) return;
  const size_t n = l.data.size() / w;
  std::vector<size_t> order(n);
  for (size_t i = 0; i < n; ++i) order[i] = i;
  const double *d = l.data.data();
  std::sort(order.begin(), order.end(), [&](size_t a, size_t b) {
    return std::lexicographical_compare(d + a * w, d + a * w + w, d + b * w, d + b * w + w);
  });
  std::vector<double> out;
  out.reserve(l.data.size());
  for (size_t i : order) out.insert(out.end(), d + i * w, d + i * w + w);
  l.data.swap(out);
}

// ---- portable bytes ---------------------------------------------------------------------

namespace {

void put32(std::string &s, uint32_t v) {
  for (int k = 3; k >= 0; --k) s += static_cast<char>((v >> (8 * k)) & 0xFF);
}
void put_double(std::string &s, double d) {
  uint64_t v;
  std::memcpy(&v, &d, 8);
  for (int k = 7; k >= 0; --k) s += static_cast<char>((v >> (8 * k)) & 0xFF);
}

struct Reader {
  const unsigned char *p, *end;
  void need(size_t n) {
    if (static_cast<size_t>(end - p) < n) bad("figure value is truncated");
  }
  uint32_t u32() {
    need(4);
    uint32_t v = 0;
    for (int k = 0; k < 4; ++k) v = (v << 8) | *p++;
    return v;
  }
  double f64() {
    need(8);
    uint64_t v = 0;
    for (int k = 0; k < 8; ++k) v = (v << 8) | *p++;
    double d;
    std::memcpy(&d, &v, 8);
    return d;
  }
};

constexpr char kMagic[4] = {'S', 'N', 'F', 1};

}  // namespace

std::string encode_figure(const Figure &f) {
  std::string s(kMagic, 4);
  put32(s, static_cast<uint32_t>(f.layers.size()));
  for (const Layer &l : f.layers) {
    s += static_cast<char>(l.kind);
    put32(s, static_cast<uint32_t>(l.label.size()));
    s += l.label;
    put32(s, static_cast<uint32_t>(l.params.size()));
    put32(s, static_cast<uint32_t>(l.data.size()));
    for (double v : l.params) put_double(s, v);
    for (double v : l.data) put_double(s, v);
  }
  return s;
}

Figure decode_figure(const char *bytes, size_t size) {
  Reader r{reinterpret_cast<const unsigned char *>(bytes), reinterpret_cast<const unsigned char *>(bytes) + size};
  r.need(4);
  if (std::memcmp(r.p, kMagic, 4) != 0) bad("not a figure value of this version");
  r.p += 4;
  const uint32_t nl = r.u32();
  if (nl > kMaxFigureLayers) bad("too many layers in a figure value");
  Figure f;
  f.layers.reserve(nl);
  for (uint32_t i = 0; i < nl; ++i) {
    Layer l;
    r.need(1);
    l.kind = static_cast<LayerKind>(*r.p++);
    const uint32_t ll = r.u32();
    if (ll > kMaxLabelBytes) bad("figure label too long");
    r.need(ll);
    l.label.assign(reinterpret_cast<const char *>(r.p), ll);
    r.p += ll;
    const uint32_t np = r.u32(), nd = r.u32();
    // Bound before allocating: every number takes 8 bytes of the input.
    if (static_cast<uint64_t>(np) + nd > static_cast<uint64_t>(r.end - r.p) / 8) bad("figure value is truncated");
    l.params.resize(np);
    l.data.resize(nd);
    for (auto &v : l.params) v = r.f64();
    for (auto &v : l.data) v = r.f64();
    f.layers.push_back(std::move(l));
  }
  if (r.p != r.end) bad("figure value has trailing bytes");
  check_figure(f);
  return f;
}

// ---- text form ---------------------------------------------------------------------------

namespace {

void json_string(std::string &s, const std::string &v) {
  s += '"';
  for (unsigned char c : v) {
    if (c == '"' || c == '\\') {
      s += '\\';
      s += static_cast<char>(c);
    } else if (c < 0x20) {
      char buf[8];
      std::snprintf(buf, sizeof buf, "\\u%04x", c);
      s += buf;
    } else {
      s += static_cast<char>(c);
    }
  }
  s += '"';
}

void json_number(std::string &s, double v) {
  char buf[64];
  const auto r = std::to_chars(buf, buf + sizeof buf, v);
  s.append(buf, r.ptr);
}

void json_array(std::string &s, const std::vector<double> &v) {
  s += '[';
  for (size_t i = 0; i < v.size(); ++i) {
    if (i) s += ", ";
    json_number(s, v[i]);
  }
  s += ']';
}

struct Parser {
  const char *text;
  const char *p;
  [[noreturn]] void fail(const std::string &what) {
    throw Error(ErrorKind::InvalidText, std::string("invalid input syntax for type net_figure: \"") +
                                            echo_text(text, 60) + "\"",
                what,
                "The text form is {\"layers\": [{\"kind\": \"poles\", \"label\": \"...\", \"params\": [...], "
                "\"data\": [...]}, ...]}.");
  }
  void ws() {
    while (*p == ' ' || *p == '\t' || *p == '\n' || *p == '\r') ++p;
  }
  void expect(char c) {
    ws();
    if (*p != c) fail(std::string("expected '") + c + "' at offset " + std::to_string(p - text) + ".");
    ++p;
  }
  bool peek(char c) {
    ws();
    return *p == c;
  }
  std::string string() {
    expect('"');
    std::string out;
    while (*p != '"') {
      if (*p == '\0') fail("unterminated string.");
      if (*p == '\\') {
        ++p;
        switch (*p) {
          case '"': out += '"'; break;
          case '\\': out += '\\'; break;
          case '/': out += '/'; break;
          case 'n': out += '\n'; break;
          case 't': out += '\t'; break;
          case 'r': out += '\r'; break;
          case 'b': out += '\b'; break;
          case 'f': out += '\f'; break;
          case 'u': {
            unsigned cp = 0;
            for (int k = 1; k <= 4; ++k) {
              const char c = p[k];
              const int d = c >= '0' && c <= '9' ? c - '0' : c >= 'a' && c <= 'f' ? c - 'a' + 10 : c >= 'A' && c <= 'F' ? c - 'A' + 10 : -1;
              if (d < 0) fail("bad \\u escape.");
              cp = cp * 16 + d;
            }
            p += 4;
            if (cp >= 0xD800 && cp <= 0xDFFF) fail("surrogate \\u escapes are not accepted; write the character itself.");
            if (cp < 0x80) {
              out += static_cast<char>(cp);
            } else if (cp < 0x800) {
              out += static_cast<char>(0xC0 | (cp >> 6));
              out += static_cast<char>(0x80 | (cp & 0x3F));
            } else {
              out += static_cast<char>(0xE0 | (cp >> 12));
              out += static_cast<char>(0x80 | ((cp >> 6) & 0x3F));
              out += static_cast<char>(0x80 | (cp & 0x3F));
            }
            break;
          }
          default: fail("bad escape in a string.");
        }
        ++p;
      } else {
        out += *p++;
      }
    }
    ++p;
    return out;
  }
  void key(const char *k) {
    if (string() != k) fail(std::string("expected the key \"") + k + "\".");
    expect(':');
  }
  std::vector<double> numbers() {
    expect('[');
    std::vector<double> out;
    if (peek(']')) {
      ++p;
      return out;
    }
    for (;;) {
      ws();
      double v;
      const char *end = p;
      while (*end && std::strchr("0123456789+-.eE", *end)) ++end;
      const auto r = std::from_chars(p, end, v);
      if (r.ec == std::errc::result_out_of_range)
        throw Error(ErrorKind::OutOfRange, std::string("value out of range for type net_figure: \"") + echo_text(text, 60) + "\"",
                    "The number at offset " + std::to_string(p - text) + " is beyond the range of float8.");
      if (r.ec != std::errc() || r.ptr != end || end == p) fail("expected a number at offset " + std::to_string(p - text) + ".");
      if (!std::isfinite(v)) fail("numbers must be finite.");
      out.push_back(v);
      p = end;
      if (out.size() > 4 * kMaxFigureItems) fail("too many numbers.");
      if (peek(',')) {
        ++p;
        continue;
      }
      expect(']');
      return out;
    }
  }
};

}  // namespace

std::string figure_to_text(const Figure &f) {
  std::string s = "{\"layers\": [";
  for (size_t i = 0; i < f.layers.size(); ++i) {
    const Layer &l = f.layers[i];
    if (i) s += ", ";
    s += "{\"kind\": ";
    json_string(s, layer_kind_name(l.kind));
    s += ", \"label\": ";
    json_string(s, l.label);
    s += ", \"params\": ";
    json_array(s, l.params);
    s += ", \"data\": ";
    json_array(s, l.data);
    s += '}';
  }
  s += "]}";
  return s;
}

Figure figure_from_text(const char *text) {
  Parser ps{text, text};
  Figure f;
  ps.expect('{');
  ps.key("layers");
  ps.expect('[');
  if (ps.peek(']')) {
    ++ps.p;
  } else {
    for (;;) {
      ps.expect('{');
      ps.key("kind");
      const std::string kind = ps.string();
      Layer l{};
      l.kind = LayerKind{0};
      for (int k = 1; k <= kLayerKindCount; ++k)
        if (kind == kKinds[k].name) l.kind = static_cast<LayerKind>(k);
      if (!known(l.kind)) ps.fail("unknown layer kind \"" + echo_text(kind, 60) + "\".");
      ps.expect(',');
      ps.key("label");
      l.label = ps.string();
      ps.expect(',');
      ps.key("params");
      l.params = ps.numbers();
      ps.expect(',');
      ps.key("data");
      l.data = ps.numbers();
      ps.expect('}');
      f.layers.push_back(std::move(l));
      if (f.layers.size() > kMaxFigureLayers) ps.fail("too many layers.");
      if (ps.peek(',')) {
        ++ps.p;
        continue;
      }
      ps.expect(']');
      break;
    }
  }
  ps.expect('}');
  ps.ws();
  if (*ps.p != '\0') ps.fail("unexpected text after the closing brace.");
  check_figure(f);
  return f;
}

}  // namespace striae
