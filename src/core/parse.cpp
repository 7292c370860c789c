// Parsers for the text notations of plane, lineation and fault_slip.
//
// A literal is split into fields at separators: a run of blanks that may hold
// one '/' or ','. Each field is one of
//   number            110   -75   64.5   (a trailing degree sign is ignored)
//   number+letters    64SW  75W         (dip with dip quadrant, pitch with strike end)
//   bearing           N70W  S60.5E      (quadrant bearing: N|S angle E|W, angle 0..90)
//   letters           SW  dd  N  normal  (quadrant, tags, slip senses)
// and an arrow form 'A->B' (or the Unicode arrow) stands on its own.
// The forms each type accepts are listed in the hint texts below.
#include "parse.hpp"

#include <charconv>
#include <cmath>
#include <cstring>
#include <string>

namespace striae {

namespace {

const char kPlaneHint[] =
    "Accepted: strike/dip by the right-hand rule ('110/64'); strike/dip with a dip "
    "quadrant ('290/64S', '110/64 SW'); quadrant bearing with a dip quadrant "
    "('N70W 64SW'); dip direction/dip tagged dd ('200/64 dd'); dip->dip direction ('64->200').";
const char kLineHint[] =
    "Accepted: trend/plunge ('120/30', a negative plunge is flipped to the lower "
    "hemisphere); quadrant bearing/plunge ('S60E/30'); plunge->trend ('30->120').";
const char kFaultHint[] =
    "Accepted: strike/dip/rake with the Aki & Richards rake ('110/64/-75'); any plane "
    "form, then an unsigned rake and a sense ('110/64/75 N'), or a pitch from a named "
    "strike end and a sense ('110/64/75W N', 'N70W 64SW/75W R'). Senses: N normal, "
    "R or T reverse, D dextral, S sinistral, or two of them ('ND').";

enum class FieldKind { Number, NumberLetters, Bearing, Letters };

struct Field {
  FieldKind kind;
  double value = 0;   // number, or bearing azimuth
  bool signed_ = false;  // number written with a sign
  const char *letters = nullptr;  // lower-cased copy in Parser::low
  size_t nletters = 0;
};

struct Parser {
  const char *type;
  const char *text;
  const char *hint;
  std::string low;  // lower-cased text
  Field f[8];
  int n = 0;

  [[noreturn]] void fail(const std::string &detail) const {
    throw Error(ErrorKind::InvalidText,
                std::string("invalid input syntax for type ") + type + ": \"" + echo_text(text) + "\"",
                detail, hint);
  }

  // A number that reads but lies outside what its field accepts (or outside
  // the range of double): 22003, as in float8 input and the numeric constructors.
  [[noreturn]] void out_of_range(const std::string &what, const std::string &accepted) const {
    throw Error(ErrorKind::OutOfRange,
                std::string("value out of range for type ") + type + ": \"" + echo_text(text) + "\"",
                what + " is out of range; accepted: " + accepted + ".", hint);
  }

  bool letters_are(const Field &x, const char *w) const {
    return x.nletters == std::strlen(w) && std::memcmp(x.letters, w, x.nletters) == 0;
  }
};

std::string upper(const char *l, size_t n) {
  std::string s(l, n);
  for (char &c : s)
    if (c >= 'a' && c <= 'z') c = static_cast<char>(c - 'a' + 'A');
  return s;
}

bool is_alpha(char c) { return c >= 'a' && c <= 'z'; }
bool is_digit(char c) { return c >= '0' && c <= '9'; }
bool is_blank(char c) { return c == ' ' || c == '\t' || c == '\n' || c == '\r'; }

// A number for a message: the shortest text that reads back to it.
std::string num_text(double v) {
  char buf[32];
  const auto r = std::to_chars(buf, buf + sizeof buf, v);
  return std::string(buf, r.ptr);
}

// Parse an unsigned decimal at p (digits, '.', exponent); returns end or nullptr.
// A number beyond the range of double (1e309, or 1e-400, which would read as 0)
// is an out-of-range error.
const char *scan_number(const Parser &ps, const char *p, const char *end, double &out) {
  const char *q = p;
  bool digits = false;
  while (q < end && is_digit(*q)) ++q, digits = true;
  if (q < end && *q == '.') {
    ++q;
    while (q < end && is_digit(*q)) ++q, digits = true;
  }
  if (!digits) return nullptr;
  if (q < end && *q == 'e') {
    const char *r = q + 1;
    if (r < end && (*r == '+' || *r == '-')) ++r;
    if (r < end && is_digit(*r)) {
      while (r < end && is_digit(*r)) ++r;
      q = r;
    }
  }
  auto res = std::from_chars(p, q, out, std::chars_format::general);
  if (res.ec == std::errc::result_out_of_range)
    ps.out_of_range("the number " + echo_text(std::string(p, q), 40), "numbers within the range of float8");
  if (res.ec != std::errc() || res.ptr != q) return nullptr;
  return q;
}

// Skip a degree sign (UTF-8 C2 B0) directly after a number.
const char *skip_degree(const char *p, const char *end) {
  if (end - p >= 2 && static_cast<unsigned char>(p[0]) == 0xC2 &&
      static_cast<unsigned char>(p[1]) == 0xB0)
    return p + 2;
  return p;
}

void classify(Parser &ps, const char *b, const char *e) {
  if (ps.n == 8) ps.fail("too many fields");
  Field &x = ps.f[ps.n++];
  const char *p = b;
  if (is_alpha(*p)) {
    if ((*p == 'n' || *p == 's') && p + 1 < e && (is_digit(p[1]) || p[1] == '.')) {
      const bool north = *p == 'n';
      double a;
      const char *q = scan_number(ps, p + 1, e, a);
      if (!q) ps.fail("bad number in a quadrant bearing");
      q = skip_degree(q, e);
      if (q + 1 != e || (*q != 'e' && *q != 'w'))
        ps.fail("a quadrant bearing is N or S, an angle from 0 to 90, then E or W, as in N70W");
      if (!(a >= 0 && a <= 90))
        ps.out_of_range("the angle " + num_text(a) + " of a quadrant bearing", "0 to 90 degrees");
      const bool east = *q == 'e';
      double az = north ? (east ? a : 360.0 - a) : (east ? 180.0 - a : 180.0 + a);
      x.kind = FieldKind::Bearing;
      x.value = norm360(az);
      return;
    }
    for (const char *q = p; q < e; ++q)
      if (!is_alpha(*q) && *q != '-') ps.fail("unexpected character '" + char_at(q, e) + "'");
    x.kind = FieldKind::Letters;
    x.letters = p;
    x.nletters = static_cast<size_t>(e - p);
    return;
  }
  if (!is_digit(*p) && *p != '.' && *p != '+' && *p != '-')
    ps.fail("unexpected character '" + char_at(p, e) + "'");
  bool neg = false, sign = false;
  if (*p == '+' || *p == '-') {
    neg = *p == '-';
    sign = true;
    ++p;
  }
  double v;
  const char *q = scan_number(ps, p, e, v);
  if (!q) ps.fail("expected a number");
  q = skip_degree(q, e);
  x.value = neg ? -v : v;
  x.signed_ = sign;
  if (q == e) {
    x.kind = FieldKind::Number;
    return;
  }
  for (const char *r = q; r < e; ++r)
    if (!is_alpha(*r)) ps.fail("unexpected character '" + char_at(r, e) + "' after a number");
  x.kind = FieldKind::NumberLetters;
  x.letters = q;
  x.nletters = static_cast<size_t>(e - q);
}

// Split into fields. Returns true and sets arrow_at if the text is an arrow form.
void split(Parser &ps) {
  const char *s = ps.low.data();
  const char *end = s + ps.low.size();
  const char *p = s;
  while (p < end && is_blank(*p)) ++p;
  while (end > p && is_blank(end[-1])) --end;
  if (p == end) ps.fail("the value is empty");
  bool need_field = true;  // a separator was just seen (or start)
  while (p < end) {
    const char *b = p;
    while (p < end && !is_blank(*p) && *p != '/' && *p != ',') ++p;
    if (p == b) ps.fail("two separators in a row, or a separator at the start or end");
    classify(ps, b, p);
    need_field = false;
    if (p == end) break;
    int hard = 0;
    while (p < end && (is_blank(*p) || *p == '/' || *p == ',')) {
      if (*p == '/' || *p == ',') ++hard;
      ++p;
    }
    if (hard > 1) ps.fail("two separators in a row");
    if (p == end) ps.fail("a separator at the end");
    need_field = true;
  }
  (void)need_field;
}

// Find an ASCII or Unicode arrow; returns its position and length, or npos.
size_t find_arrow(const std::string &s, size_t &len) {
  size_t a = s.find("->");
  if (a != std::string::npos) {
    len = 2;
    return a;
  }
  a = s.find("\xE2\x86\x92");  // U+2192 RIGHTWARDS ARROW
  len = 3;
  return a;
}

// One number or bearing on one side of an arrow.
double arrow_side(Parser &ps, const std::string &side, bool allow_bearing, const char *what) {
  Parser sub{ps.type, ps.text, ps.hint, side, {}, 0};
  split(sub);
  if (sub.n != 1) ps.fail(std::string("expected one ") + what + " on each side of the arrow");
  const Field &x = sub.f[0];
  if (x.kind == FieldKind::Number) return x.value;
  if (x.kind == FieldKind::Bearing && allow_bearing) return x.value;
  ps.fail(std::string("expected a number for the ") + what);
}

bool try_arrow(Parser &ps, double &left, double &right, const char *lname, const char *rname) {
  size_t len;
  const size_t a = find_arrow(ps.low, len);
  if (a == std::string::npos) return false;
  left = arrow_side(ps, ps.low.substr(0, a), false, lname);
  right = arrow_side(ps, ps.low.substr(a + len), true, rname);
  return true;
}

// Pick the dip direction (strike +- 90) that lies toward the compass letters.
// One letter names a half of the compass (within 90 degrees), two letters a
// quadrant (within 45 degrees). Returns the right-hand-rule strike.
double strike_toward(Parser &ps, double strike, const Field &q, const char *what) {
  const double az = compass_azimuth(q.letters, q.nletters);
  if (az < 0)
    ps.fail(std::string("\"") + upper(q.letters, q.nletters) + "\" is not a " + what +
            " (use N, NE, E, SE, S, SW, W or NW)");
  const double half = q.nletters == 1 ? 90.0 : 45.0;
  const double c1 = norm360(strike + 90.0), c2 = norm360(strike - 90.0);
  auto gap = [&](double c) {
    double g = std::fabs(norm360(c - az));
    return g > 180.0 ? 360.0 - g : g;
  };
  const double g1 = gap(c1), g2 = gap(c2);
  constexpr double tol = 1e-9;
  const bool ok1 = q.nletters == 1 ? g1 < half - tol : g1 <= half + tol;
  const bool ok2 = q.nletters == 1 ? g2 < half - tol : g2 <= half + tol;
  const std::string L = upper(q.letters, q.nletters);
  if ((ok1 && ok2) || (!ok1 && !ok2 && std::fabs(g1 - g2) < tol))
    ps.fail(L + " is at right angles to the strike: it cannot tell which way the plane dips");
  if (!ok1 && !ok2)
    ps.fail(std::string("a plane striking ") + std::to_string(static_cast<int>(std::lround(strike))) +
            " dips neither way toward " + L);
  return ok1 ? norm360(strike) : norm360(strike + 180.0);
}

double check_azimuth(Parser &ps, const Field &x, const char *what) {
  if (x.kind != FieldKind::Number && x.kind != FieldKind::Bearing)
    ps.fail(std::string("expected a ") + what);
  return x.value;
}

// Parse the plane part of a literal starting at field 0. Returns the number of
// fields consumed; sets rhr_given if the strike as written is the
// right-hand-rule strike (no letters flipped it), and then rhr_strike to that
// strike as written: a rake is measured from it, and the plane's canonical
// strike may differ (a vertical plane striking 270 is stored as 90/90; a
// horizontal one as 0/0), so the rake must go with the written strike into
// make_fault_slip, exactly as the numeric constructor and binary input do.
int parse_plane_fields(Parser &ps, Plane &out, bool &rhr_given, double &rhr_strike, bool allow_tail) {
  if (ps.n < 2) ps.fail("expected at least a strike and a dip");
  const Field &a = ps.f[0], &b = ps.f[1];
  if (a.kind != FieldKind::Number && a.kind != FieldKind::Bearing)
    ps.fail("expected a strike (azimuth or quadrant bearing) first");
  if (b.kind != FieldKind::Number && b.kind != FieldKind::NumberLetters)
    ps.fail("expected a dip after the strike");
  // A negative strike or dip is a number out of range (make_plane says so, 22003).
  const double strike = a.value, dip = b.value;
  rhr_strike = strike;
  // Letters after the dip: attached ('64SW') or as the next field ('64 SW').
  const Field *q = nullptr;
  int used = 2;
  if (b.kind == FieldKind::NumberLetters) q = &b;
  else if (ps.n > 2 && ps.f[2].kind == FieldKind::Letters &&
           (compass_azimuth(ps.f[2].letters, ps.f[2].nletters) >= 0 || ps.letters_are(ps.f[2], "dd"))) {
    q = &ps.f[2];
    used = 3;
  }
  if (!allow_tail && used < ps.n) ps.fail("unexpected text after the dip");
  if (q && ps.letters_are(*q, "dd")) {
    if (a.kind == FieldKind::Bearing) ps.fail("the dd form takes a dip direction azimuth, not a bearing");
    out = make_plane_from_dip_direction(strike, dip);
    rhr_given = false;
    return used;
  }
  if (q) {
    if (!(strike >= 0 && strike <= 360)) make_plane(strike, dip);  // raises the range error
    const double rhr = strike_toward(ps, strike, *q, "dip quadrant");
    out = make_plane(rhr, dip);
    rhr_given = a.kind == FieldKind::Number && std::fabs(norm360(strike) - rhr) < 1e-12;
    rhr_strike = strike;
    return used;
  }
  if (a.kind == FieldKind::Bearing)
    ps.fail("a quadrant bearing strike needs the dip quadrant, as in 'N70W 64SW'");
  out = make_plane(strike, dip);
  rhr_given = true;
  return used;
}

}  // namespace

double compass_azimuth(const char *l, size_t n) {
  if (n == 1) {
    switch (l[0]) {
      case 'n': return 0;
      case 'e': return 90;
      case 's': return 180;
      case 'w': return 270;
      default: return -1;
    }
  }
  if (n == 2) {
    if (l[0] == 'n' && l[1] == 'e') return 45;
    if (l[0] == 's' && l[1] == 'e') return 135;
    if (l[0] == 's' && l[1] == 'w') return 225;
    if (l[0] == 'n' && l[1] == 'w') return 315;
  }
  return -1;
}

namespace {

std::string lower(const char *t) {
  std::string s(t);
  for (char &c : s)
    if (c >= 'A' && c <= 'Z') c = static_cast<char>(c - 'A' + 'a');
  return s;
}

}  // namespace

Plane parse_plane(const char *text) {
  Parser ps{"plane", text, kPlaneHint, lower(text), {}, 0};
  double dip, dipdir;
  if (try_arrow(ps, dip, dipdir, "dip", "dip direction")) return make_plane_from_dip_direction(dipdir, dip);
  split(ps);
  Plane p;
  bool rhr;
  double written;
  parse_plane_fields(ps, p, rhr, written, false);
  return p;
}

Line parse_line(const char *text) {
  Parser ps{"lineation", text, kLineHint, lower(text), {}, 0};
  double plunge, trend;
  if (try_arrow(ps, plunge, trend, "plunge", "trend")) {
    if (plunge < 0) ps.out_of_range("the plunge " + num_text(plunge), "in the arrow form, 0 to 90 degrees");
    return make_line(trend, plunge);
  }
  split(ps);
  if (ps.n != 2) ps.fail("expected a trend and a plunge");
  const double trend2 = check_azimuth(ps, ps.f[0], "trend (azimuth or quadrant bearing)");
  if (ps.f[1].kind != FieldKind::Number) ps.fail("expected a plunge after the trend");
  return make_line(trend2, ps.f[1].value);
}

FaultSlip parse_fault_slip(const char *text) {
  Parser ps{"fault_slip", text, kFaultHint, lower(text), {}, 0};
  if (ps.low.find("->") != std::string::npos || ps.low.find("\xE2\x86\x92") != std::string::npos)
    ps.fail("the arrow form is for planes and lineations only");
  split(ps);
  Plane p;
  bool rhr;
  double written;  // the right-hand-rule strike as written, when rhr
  const int used = parse_plane_fields(ps, p, rhr, written, true);
  if (used >= ps.n) ps.fail("expected a rake after the dip");
  const Field &r = ps.f[used];
  const int rest = ps.n - used - 1;  // fields after the rake
  if (r.kind == FieldKind::Number && rest == 0) {
    // Signed Aki & Richards rake: measured from the right-hand-rule strike.
    if (!rhr)
      ps.fail("a rake is measured from the right-hand-rule strike; with a flipped strike or "
              "a dd form give a pitch from a named strike end, as in '290/64S/75W N'");
    return make_fault_slip(written, p.dip, r.value);
  }
  if (rest == 0) ps.fail("a pitch needs a slip sense, as in '110/64/75W N'");
  if (r.signed_ && r.value < 0)
    ps.out_of_range(std::string(r.kind == FieldKind::Number ? "the unsigned rake " : "the pitch ") + num_text(r.value),
                    r.kind == FieldKind::Number ? "an unsigned rake from 0 to 180 degrees, its sign given by the sense"
                                                : "a pitch from 0 to 90 degrees");
  // Collect the sense from the remaining fields.
  std::string sense_text;
  for (int i = used + 1; i < ps.n; ++i) {
    const Field &x = ps.f[i];
    if (x.kind != FieldKind::Letters) ps.fail("expected a slip sense after the rake or pitch");
    std::string w(x.letters, x.nletters);
    bool letters_only = w.size() <= 2;
    for (char c : w)
      if (c != 'n' && c != 'r' && c != 't' && c != 'd' && c != 's') letters_only = false;
    if (letters_only) {
      for (char c : w) sense_text += std::string(1, c) + " ";
    } else {
      sense_text += w + " ";
    }
  }
  Sense sense;
  try {
    sense = parse_sense(sense_text);
  } catch (const Error &e) {
    ps.fail(e.what());
  }
  if (r.kind == FieldKind::Number) {
    // Unsigned rake q in [0,180]: normal gives -q, reverse +q.
    const double q = r.value;
    if (!(q >= 0 && q <= 180))
      ps.out_of_range("the unsigned rake " + num_text(q), "an unsigned rake from 0 to 180 degrees");
    const bool horizontal = q == 0 || q == 180;
    if (sense.dip != 0 && horizontal)
      ps.fail("a horizontal slip (rake 0 or 180) cannot be normal or reverse");
    if (sense.dip == 0 && !horizontal)
      ps.fail("an unsigned rake needs N or R to give its sign");
    if (sense.strike != 0) {
      if (q == 90) ps.fail("a down-dip slip (rake 90) cannot be dextral or sinistral");
      const int implied = q < 90 ? 1 : -1;
      if (implied != sense.strike) ps.fail("the slip sense contradicts the rake");
    }
    if (!rhr)
      ps.fail("a rake is measured from the right-hand-rule strike; with a flipped strike or "
              "a dd form give a pitch from a named strike end, as in '290/64S/75W N'");
    const double rake = sense.dip > 0 ? -q : q;
    return make_fault_slip(written, p.dip, rake);
  }
  if (r.kind != FieldKind::NumberLetters) ps.fail("expected a rake or a pitch after the dip");
  // Pitch psi in [0,90] from the strike end named by the attached letters.
  const double psi = r.value;
  if (!(psi >= 0 && psi <= 90)) ps.out_of_range("the pitch " + num_text(psi), "a pitch from 0 to 90 degrees");
  const double end_az = compass_azimuth(r.letters, r.nletters);
  if (end_az < 0)
    ps.fail("\"" + upper(r.letters, r.nletters) +
            "\" is not a strike end; attach N, NE, E, SE, S, SW, W or NW to the pitch");
  // Choose the strike end (strike or strike+180) toward the letters.
  const double half = r.nletters == 1 ? 90.0 : 45.0;
  auto gap = [&](double c) {
    double g = std::fabs(norm360(c - end_az));
    return g > 180.0 ? 360.0 - g : g;
  };
  const double e1 = p.strike, e2 = norm360(p.strike + 180.0);
  const bool ok1 = r.nletters == 1 ? gap(e1) < half - 1e-9 : gap(e1) <= half + 1e-9;
  const bool ok2 = r.nletters == 1 ? gap(e2) < half - 1e-9 : gap(e2) <= half + 1e-9;
  if (ok1 == ok2)
    ps.fail(upper(r.letters, r.nletters) +
            (ok1 || std::fabs(gap(e1) - gap(e2)) < 1e-9
                 ? " is at right angles to the strike: it cannot tell which end the pitch is from"
                 : " is toward neither end of the strike line"));
  const double end = ok1 ? e1 : e2;
  const Vec3 line = std::cos(rad(psi)) * strike_vector(end) + std::sin(rad(psi)) * dip_vector(p.strike, p.dip);
  try {
    return fault_from_striation(p, line, sense, 0.0);
  } catch (const Error &e) {
    ps.fail(e.what());
  }
}

}  // namespace striae
