// Parser of the stress_tensor text form (see stress_text.hpp).
#include "stress_text.hpp"

#include <charconv>
#include <string>

namespace striae {

namespace {


// A small recursive reader for the text form (stress_text.hpp).
class TensorReader {
 public:
  explicit TensorReader(const char *s) : text_(s), p_(s) {}

  StressTensor read() {
    StressTensor t{};
    t.version = kStressTensorVersion;
    bool have_c = false, have_n = false, have_m = false, have_cones = false, have_phi = false,
         have_mu = false, have_flags = false;
    expect('{');
    skip_ws();
    if (*p_ == '}') fail("\"components\" and \"n\" are required");
    for (;;) {
      const std::string key = string_token();
      expect(':');
      if (key == "components") {
        once(have_c, key);
        double c[6];
        numbers(c, 6);
        t.nn = c[0]; t.ee = c[1]; t.dd = c[2]; t.ne = c[3]; t.nd = c[4]; t.ed = c[5];
      } else if (key == "n") {
        once(have_n, key);
        t.data_count = integer();
      } else if (key == "misfit") {
        once(have_m, key);
        t.mean_misfit = number();
        t.flags |= kStressHasMisfit;
      } else if (key == "cones") {
        once(have_cones, key);
        numbers(t.cone, 3);
        t.flags |= kStressHasCones;
      } else if (key == "phi_interval") {
        once(have_phi, key);
        double v[2];
        numbers(v, 2);
        t.phi_lo = v[0];
        t.phi_hi = v[1];
        t.flags |= kStressHasPhiInterval;
      } else if (key == "friction") {
        once(have_mu, key);
        t.friction = number();
        t.flags |= kStressHasFriction;
      } else if (key == "flags") {
        once(have_flags, key);
        flags(t.flags);
      } else {
        fail("unknown key \"" + echo_text(key, 40) + "\"");
      }
      skip_ws();
      if (*p_ == ',') { ++p_; continue; }
      if (*p_ == '}') { ++p_; break; }
      fail("expected \",\" or \"}\"");
    }
    skip_ws();
    if (*p_ != '\0') fail("unexpected text after \"}\"");
    if (!have_c || !have_n) fail("\"components\" and \"n\" are required");
    return t;
  }

 private:
  const char *text_;
  const char *p_;

  [[noreturn]] void fail(const std::string &why) const {
    throw Error(ErrorKind::InvalidText,
                std::string("invalid input syntax for type stress_tensor: \"") + echo_text(text_) + "\"",
                why + "; accepted: {\"components\": [nn, ee, dd, ne, nd, ed], \"n\": count} and optional "
                      "\"misfit\", \"cones\" [3], \"phi_interval\" [2], \"friction\", \"flags\" [\"focal_joint\", \"not_converged\", \"friction_at_limit\"]");
  }
  void skip_ws() {
    while (*p_ == ' ' || *p_ == '\t' || *p_ == '\n' || *p_ == '\r') ++p_;
  }
  void expect(char c) {
    skip_ws();
    if (*p_ != c) fail(std::string("expected \"") + c + "\"");
    ++p_;
  }
  void once(bool &seen, const std::string &key) {
    if (seen) fail("key \"" + key + "\" given twice");
    seen = true;
  }
  std::string string_token() {
    expect('"');
    const char *b = p_;
    while (*p_ && *p_ != '"') ++p_;
    if (*p_ != '"') fail("unterminated string");
    std::string s(b, p_);
    ++p_;
    return s;
  }
  // The run of characters a number can be made of (sign, digits, point, exponent).
  const char *number_end() {
    skip_ws();
    const char *e = p_;
    while ((*e >= '0' && *e <= '9') || *e == '-' || *e == '+' || *e == '.' || *e == 'e' || *e == 'E') ++e;
    if (e == p_) fail("expected a number");
    return e;
  }
  double number() {
    const char *e = number_end();
    double v = 0;
    auto r = std::from_chars(p_, e, v, std::chars_format::general);
    if (r.ec == std::errc::result_out_of_range && r.ptr == e)
      throw Error(ErrorKind::OutOfRange,
                  std::string("value out of range for type stress_tensor: \"") + echo_text(text_) + "\"",
                  "The number " + echo_text(std::string(p_, e), 40) + " is beyond the range of float8.");
    if (r.ec != std::errc() || r.ptr != e) fail("bad number");
    p_ = e;
    return v;
  }
  int64_t integer() {
    const char *e = number_end();
    int64_t v = 0;
    auto r = std::from_chars(p_, e, v);
    if (r.ec == std::errc::result_out_of_range && r.ptr == e)
      throw Error(ErrorKind::OutOfRange,
                  std::string("value out of range for type stress_tensor: \"") + echo_text(text_) + "\"",
                  "\"n\" " + echo_text(std::string(p_, e), 40) + " is beyond the range of bigint.");
    if (r.ec != std::errc() || r.ptr != e) fail("\"n\" must be an integer");
    p_ = e;
    return v;
  }
  void numbers(double *out, int n) {
    expect('[');
    for (int i = 0; i < n; ++i) {
      if (i) expect(',');
      out[i] = number();
    }
    expect(']');
  }
  void flags(uint32_t &f) {
    expect('[');
    skip_ws();
    if (*p_ == ']') { ++p_; return; }
    for (;;) {
      const std::string s = string_token();
      if (s == kStressFlagFocal) f |= kStressFocalJoint;
      else if (s == kStressFlagNotConverged) f |= kStressNotConverged;
      else if (s == kStressFlagFrictionAtLimit) f |= kStressFrictionAtLimit;
      else fail("unknown flag \"" + echo_text(s, 40) + "\"");
      skip_ws();
      if (*p_ == ',') { ++p_; continue; }
      if (*p_ == ']') { ++p_; return; }
      fail("expected \",\" or \"]\"");
    }
  }
};

}  // namespace

StressTensor parse_stress_tensor(const char *text) {
  StressTensor t = TensorReader(text).read();
  clear_negative_zeros(t);
  return t;
}

}  // namespace striae
