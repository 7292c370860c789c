// Orientation primitives: canonical forms, vectors and basic geometry.
// Formulas: METHODS.md section 1 (Aki & Richards 1980 conventions, NED axes).
#include "orientation.hpp"

#include <cctype>
#include <cmath>
#include <cstdio>

namespace striae {

namespace {

// Format a number for an error message (not for data output).
std::string num(double v) {
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.17g", v);
  return buf;
}

void require_finite(double v, const char *what) {
  if (!std::isfinite(v))
    throw Error(ErrorKind::OutOfRange, std::string(what) + " must be a finite number",
                "NaN and infinite values are not orientations.");
}

void require_range(double v, double lo, double hi, const char *what, const char *accepted) {
  require_finite(v, what);
  if (v < lo || v > hi)
    throw Error(ErrorKind::OutOfRange,
                std::string(what) + " " + num(v) + " is out of range",
                std::string("Accepted: ") + accepted + ".");
}

// Turn -0.0 into +0.0 so that byte equality (hash opclass) matches value equality.
inline double unneg(double v) { return v == 0.0 ? 0.0 : v; }

}  // namespace

namespace detail {

namespace {

// sin and cos of every whole degree 0..360. Degrees 0..90 come from the C
// library in long double (64-bit mantissa), rounded once to double, so they are
// the correctly rounded values (sin 30 = 0.5 exactly); the other quadrants are
// exact sign-and-swap copies, so identities such as sin(180 - x) = sin x and
// cos x = sin(90 - x) hold bit for bit at whole degrees.
struct DegreeTable {
  double sc[361][2];
  DegreeTable() {
    const long double pi = 3.141592653589793238462643383279502884L;
    double s[91];
    for (int j = 0; j <= 90; ++j) s[j] = static_cast<double>(sinl(j * pi / 180));
    s[0] = 0.0;
    s[30] = 0.5;
    s[90] = 1.0;
    auto set = [this](int k, double a, double b) {
      sc[k][0] = a + 0.0;  // + 0.0: no negative zeros
      sc[k][1] = b + 0.0;
    };
    for (int j = 0; j <= 90; ++j) {
      const double sj = s[j], cj = s[90 - j];
      set(j, sj, cj);
      set(180 - j, sj, -cj);
      set(180 + j, -sj, -cj);
      set(360 - j, -sj, cj);
    }
  }
};

const DegreeTable kDegreeTable;

}  // namespace

const double (*const kDegreeTrig)[2] = kDegreeTable.sc;

}  // namespace detail

double sind(double x) {
  double s, c;
  sincosd(x, s, c);
  return s;
}

double cosd(double x) {
  double s, c;
  sincosd(x, s, c);
  return c;
}

double snap_angle(double d) {
  // 1e-10 degree grid; values beyond 1e6 degrees never reach here.
  double s = std::round(d * 1e10) / 1e10;
  return unneg(s);
}

double norm360(double d) {
  double r = std::fmod(d, 360.0);
  if (r < 0) r += 360.0;
  if (r >= 360.0) r -= 360.0;
  return unneg(r);
}

double norm180(double d) {
  double r = std::fmod(d, 360.0);  // (-360, 360)
  if (r > 180.0) r -= 360.0;
  if (r <= -180.0) r += 360.0;
  return unneg(r);
}

Plane make_plane(double strike, double dip) {
  require_range(strike, 0.0, 360.0, "strike", "strike from 0 to 360 degrees");
  require_range(dip, 0.0, 90.0, "dip", "dip from 0 to 90 degrees");
  Plane p{norm360(strike), unneg(dip)};
  if (p.dip == 0.0) p.strike = 0.0;                           // every strike is the same plane
  if (p.dip == 90.0 && p.strike >= 180.0) p.strike -= 180.0;  // both strikes name one plane
  return p;
}

Plane make_plane_from_dip_direction(double dip_direction, double dip) {
  require_range(dip_direction, 0.0, 360.0, "dip direction", "dip direction from 0 to 360 degrees");
  require_range(dip, 0.0, 90.0, "dip", "dip from 0 to 90 degrees");
  return make_plane(norm360(dip_direction - 90.0), dip);
}

Line make_line(double trend, double plunge) {
  require_range(trend, 0.0, 360.0, "trend", "trend from 0 to 360 degrees");
  require_range(plunge, -90.0, 90.0, "plunge", "plunge from -90 to 90 degrees (negative is upward)");
  Line l{norm360(trend), unneg(plunge)};
  if (l.plunge < 0) {  // upward: the same axis points down the other way
    l.plunge = -l.plunge;
    l.trend = norm360(l.trend + 180.0);
  }
  if (l.plunge == 0.0 && l.trend >= 180.0) l.trend -= 180.0;
  if (l.plunge == 90.0) l.trend = 0.0;
  return l;
}

FaultSlip make_fault_slip(double strike, double dip, double rake) {
  require_range(strike, 0.0, 360.0, "strike", "strike from 0 to 360 degrees");
  require_range(dip, 0.0, 90.0, "dip", "dip from 0 to 90 degrees");
  require_range(rake, -180.0, 180.0, "rake", "rake from -180 to 180 degrees (Aki & Richards)");
  FaultSlip f{norm360(strike), unneg(dip), norm180(rake)};
  if (f.dip == 0.0) {
    // Horizontal fault: slip azimuth is strike - rake; re-measure from strike 0.
    f.rake = norm180(f.rake - f.strike);
    f.strike = 0.0;
  } else if (f.dip == 90.0 && f.strike >= 180.0) {
    // (f, 90, r) and (f+180, 90, -r) are the same relative motion.
    f.strike -= 180.0;
    f.rake = norm180(-f.rake);
  }
  return f;
}

namespace {
// Wrap a finite angle; leave a non-finite one for the range check to reject.
double wrap360(double v) { return std::isfinite(v) ? norm360(v) : v; }
double wrap180(double v) { return std::isfinite(v) ? norm180(v) : v; }
}  // namespace

Plane make_plane_wrapping(double strike, double dip) { return make_plane(wrap360(strike), dip); }

Plane make_plane_from_dip_direction_wrapping(double dip_direction, double dip) {
  return make_plane_from_dip_direction(wrap360(dip_direction), dip);
}

Line make_line_wrapping(double trend, double plunge) { return make_line(wrap360(trend), plunge); }

FaultSlip make_fault_slip_wrapping(double strike, double dip, double rake) {
  return make_fault_slip(wrap360(strike), dip, wrap180(rake));
}

bool is_canonical(const Plane &p) {
  if (!std::isfinite(p.strike) || !std::isfinite(p.dip)) return false;
  if (p.strike < 0 || p.strike > 360 || p.dip < 0 || p.dip > 90) return false;
  Plane c = make_plane(p.strike, p.dip);
  return std::signbit(p.strike) == 0 && std::signbit(p.dip) == 0 && c.strike == p.strike &&
         c.dip == p.dip;
}

bool is_canonical(const Line &l) {
  if (!std::isfinite(l.trend) || !std::isfinite(l.plunge)) return false;
  if (l.trend < 0 || l.trend > 360 || l.plunge < 0 || l.plunge > 90) return false;
  Line c = make_line(l.trend, l.plunge);
  return std::signbit(l.trend) == 0 && std::signbit(l.plunge) == 0 && c.trend == l.trend &&
         c.plunge == l.plunge;
}

bool is_canonical(const FaultSlip &f) {
  if (!std::isfinite(f.strike) || !std::isfinite(f.dip) || !std::isfinite(f.rake)) return false;
  if (f.strike < 0 || f.strike > 360 || f.dip < 0 || f.dip > 90 || f.rake < -180 || f.rake > 180)
    return false;
  FaultSlip c = make_fault_slip(f.strike, f.dip, f.rake);
  return std::signbit(f.strike) == 0 && std::signbit(f.dip) == 0 &&
         (f.rake != 0 || std::signbit(f.rake) == 0) && c.strike == f.strike && c.dip == f.dip &&
         c.rake == f.rake;
}

Line vector_line(const Vec3 &v0) {
  const double len = v0.norm();
  if (!(len > 0) || !std::isfinite(len))
    throw Error(ErrorKind::DataError, "cannot take the orientation of a zero or non-finite vector");
  Vec3 v = v0 / len;
  if (v.z() < 0) v = -v;
  const double h = std::hypot(v.x(), v.y());
  double plunge = snap_angle(deg(std::atan2(v.z(), h)));
  double trend = snap_angle(norm360(deg(std::atan2(v.y(), v.x()))));
  if (trend >= 360.0) trend -= 360.0;
  if (plunge > 90.0) plunge = 90.0;
  return make_line(trend, plunge);
}

Vec3 strike_vector(double strike_deg) {
  double s, c;
  sincosd(strike_deg, s, c);
  return Vec3(c, s, 0.0);
}

Vec3 dip_vector(double strike_deg, double dip_deg) {
  double sf, cf, sd, cd;
  sincosd(strike_deg, sf, cf);
  sincosd(dip_deg, sd, cd);
  return Vec3(-cd * sf, cd * cf, sd);
}

Plane normal_plane(const Vec3 &v) {
  // Derived value: round again after the +90, so results print like vector_line's.
  const Line l = vector_line(v);
  return make_plane(snap_angle(norm360(l.trend + 90.0)) == 360.0 ? 0.0 : snap_angle(norm360(l.trend + 90.0)),
                    snap_angle(90.0 - l.plunge));
}

Line pole(const Plane &p) { return make_line(norm360(p.strike - 90.0), 90.0 - p.dip); }

Plane plane_from_pole(const Line &l) {
  return make_plane(norm360(l.trend + 90.0), 90.0 - l.plunge);
}

double dip_direction(const Plane &p) { return norm360(p.strike + 90.0); }

FaultSlip fault_from_vectors(const Vec3 &n0, const Vec3 &u0) {
  const double nl = n0.norm();
  if (!(nl > 0) || !std::isfinite(nl))
    throw Error(ErrorKind::DataError, "fault normal is a zero or non-finite vector");
  Vec3 n = n0 / nl;
  Vec3 u = u0 - u0.dot(n) * n;
  const double ul = u.norm();
  if (!(ul > 1e-12) || !std::isfinite(ul))
    throw Error(ErrorKind::DataError, "slip vector has no component in the fault plane");
  u /= ul;
  if (n.z() > 0) {  // keep n pointing up, into the hanging wall
    n = -n;
    u = -u;
  }
  const double h = std::hypot(n.x(), n.y());
  double dip = snap_angle(deg(std::atan2(h, -n.z())));
  double strike = h > 0 ? snap_angle(norm360(deg(std::atan2(-n.x(), n.y())))) : 0.0;
  if (strike >= 360.0) strike -= 360.0;
  if (dip > 90.0) dip = 90.0;
  const Vec3 s = strike_vector(strike), dd = dip_vector(strike, dip);
  double rake = snap_angle(deg(std::atan2(-u.dot(dd), u.dot(s))));
  if (rake < -180.0) rake = -180.0;
  return make_fault_slip(strike, dip, rake);
}

double axial_angle(const Vec3 &a, const Vec3 &b) {
  // atan2 of |cross| and |dot| keeps precision for nearly parallel axes.
  return deg(std::atan2(a.cross(b).norm(), std::fabs(a.dot(b))));
}

double angle(const Line &a, const Line &b) { return axial_angle(line_vector(a), line_vector(b)); }

double angle(const Plane &a, const Plane &b) {
  return axial_angle(plane_normal(a), plane_normal(b));
}

Line intersection(const Plane &a, const Plane &b) {
  const Vec3 na = plane_normal(a), nb = plane_normal(b);
  if (axial_angle(na, nb) < kParallelLimitDeg)
    throw Error(ErrorKind::DataError, "planes are parallel: they have no single line of intersection",
                "The planes are less than 1e-6 degree apart.");
  return vector_line(na.cross(nb));
}

Plane plane_through(const Line &a, const Line &b) {
  const Vec3 va = line_vector(a), vb = line_vector(b);
  if (axial_angle(va, vb) < kParallelLimitDeg)
    throw Error(ErrorKind::DataError, "lines are parallel: they do not define a single plane",
                "The lines are less than 1e-6 degree apart.");
  return normal_plane(va.cross(vb));
}

const char *slip_sense(const FaultSlip &f) {
  const double r = f.rake;  // (-180, 180]
  const double a = std::fabs(r);
  // Pure senses within 22.5 degrees of their direction.
  if (a <= 22.5) return "sinistral";
  if (a >= 157.5) return "dextral";
  if (std::fabs(a - 90.0) <= 22.5) return r > 0 ? "reverse" : "normal";
  // Dip slip is named first when it is at least as large as strike slip,
  // |sin r| >= |cos r|, i.e. 45 <= |r| <= 135, decided on the rake itself: at
  // 45 and 135 exactly the two components are equal, and sin and cos of the
  // rounded radian angle would break that tie one way at 45 and the other at 135.
  const bool dip_dominant = a >= 45.0 && a <= 135.0;
  const bool rev = r > 0, dex = a > 90.0;
  if (dip_dominant) {
    if (rev) return dex ? "reverse-dextral" : "reverse-sinistral";
    return dex ? "normal-dextral" : "normal-sinistral";
  }
  if (rev) return dex ? "dextral-reverse" : "sinistral-reverse";
  return dex ? "dextral-normal" : "sinistral-normal";
}

namespace {

// Apply one sense word to s; returns false if the word is unknown.
bool apply_sense_word(const std::string &w, Sense &s, std::string &err) {
  int dip = 0, strike = 0;
  if (w == "n" || w == "normal") dip = 1;
  else if (w == "r" || w == "reverse" || w == "t" || w == "thrust") dip = -1;
  else if (w == "d" || w == "dextral" || w == "right-lateral" || w == "rl") strike = -1;
  else if (w == "s" || w == "sinistral" || w == "left-lateral" || w == "ll") strike = 1;
  else {
    err = "unknown slip sense \"" + echo_text(w, 40) + "\"";
    return false;
  }
  if (dip != 0) {
    if (s.dip != 0) {
      err = s.dip == dip ? "slip sense repeats its dip-slip part" : "slip sense is both normal and reverse";
      return false;
    }
    s.dip = dip;
  }
  if (strike != 0) {
    if (s.strike != 0) {
      err = s.strike == strike ? "slip sense repeats its strike-slip part"
                               : "slip sense is both dextral and sinistral";
      return false;
    }
    s.strike = strike;
  }
  return true;
}

}  // namespace

Sense parse_sense(const std::string &text) {
  std::string low;
  low.reserve(text.size());
  for (char c : text) low.push_back(static_cast<char>(std::tolower(static_cast<unsigned char>(c))));
  Sense s;
  std::string err;
  // Whole-word lateral terms keep their hyphen.
  std::string word;
  auto flush = [&](void) -> bool {
    if (word.empty()) return true;
    bool ok = apply_sense_word(word, s, err);
    word.clear();
    return ok;
  };
  bool ok = true;
  for (size_t i = 0; i <= low.size() && ok; ++i) {
    const char c = i < low.size() ? low[i] : ' ';
    const bool sep = c == ' ' || c == '\t' || c == ',' || c == '+' || c == '/' || c == '-';
    if (c == '-' && (word == "right" || word == "left")) {
      word.push_back(c);
      continue;
    }
    if (sep) ok = flush();
    else word.push_back(c);
  }
  if (ok && s.dip == 0 && s.strike == 0) {
    err = "slip sense is empty";
    ok = false;
  }
  if (!ok)
    throw Error(ErrorKind::InvalidParameter, err,
                "Accepted: normal, reverse (or thrust), dextral, sinistral, their first letters "
                "n, r, t, d, s, right-lateral, left-lateral, or one dip-slip and one strike-slip "
                "sense together, e.g. 'normal-dextral'.");
  return s;
}

FaultSlip fault_from_striation(const Plane &p, const Vec3 &line, const Sense &sense,
                               double tolerance_deg) {
  if (!std::isfinite(tolerance_deg) || tolerance_deg < 0 || tolerance_deg >= 90)
    throw Error(ErrorKind::InvalidParameter, "striation tolerance must be at least 0 and below 90 degrees");
  const Vec3 n = plane_normal(p);
  const Vec3 l = line.normalized();
  const double off = 90.0 - axial_angle(n, l);  // angle between line and plane
  if (off > tolerance_deg + 1e-9) {
    char buf[160];
    std::snprintf(buf, sizeof buf,
                  "striation lies %.3g degrees off its fault plane, more than the tolerance of %.3g degrees",
                  off, tolerance_deg);
    throw Error(ErrorKind::DataError, buf,
                "", "Check the measurement, or raise the tolerance argument if the data allow it.");
  }
  Vec3 v = l - l.dot(n) * n;  // projection onto the plane
  if (v.norm() < 1e-12)
    throw Error(ErrorKind::DataError, "striation is perpendicular to its fault plane");
  v.normalize();
  const Vec3 s = strike_vector(p.strike);
  constexpr double kZero = 1e-9;  // a component this small cannot carry a sense
  if (sense.dip != 0 && std::fabs(v.z()) < kZero)
    throw Error(ErrorKind::DataError,
                std::string("slip sense '") + (sense.dip > 0 ? "normal" : "reverse") +
                    "' cannot be expressed by a horizontal striation",
                "A horizontal striation records strike slip: give dextral or sinistral.");
  if (sense.strike != 0 && std::fabs(v.dot(s)) < kZero)
    throw Error(ErrorKind::DataError,
                std::string("slip sense '") + (sense.strike < 0 ? "dextral" : "sinistral") +
                    "' cannot be expressed by a down-dip striation",
                "A down-dip striation records dip slip: give normal or reverse.");
  // Hanging-wall slip u = +v or -v: normal moves the hanging wall down (u.z > 0),
  // sinistral moves it along strike (u.s > 0).
  int sign = 0;
  if (sense.dip != 0) sign = (v.z() > 0) == (sense.dip > 0) ? 1 : -1;
  if (sense.strike != 0) {
    const int s2 = (v.dot(s) > 0) == (sense.strike > 0) ? 1 : -1;
    if (sign != 0 && s2 != sign)
      throw Error(ErrorKind::DataError,
                  "slip sense contradicts itself on this striation",
                  "On this striation the dip-slip and strike-slip senses given cannot both hold.");
    sign = s2;
  }
  if (sign == 0) throw Error(ErrorKind::InvalidParameter, "slip sense is empty");
  return fault_from_vectors(n, sign * v);
}

}  // namespace striae
