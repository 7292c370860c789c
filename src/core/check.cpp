// Literal checks for screening staging tables, and the field-book constructor.
// Both sit on top of the existing parsers: nothing here parses a notation
// itself, it only runs the parser and turns its error into a reason.
#include "check.hpp"

#include "grid.hpp"
#include "parse.hpp"
#include "stress_text.hpp"

#include <cstring>
#include <string>
#include <vector>

namespace striae {

Notation notation_named(const char *name) {
  static const struct {
    const char *name;
    Notation kind;
  } kNames[] = {{"plane", Notation::Plane},
                {"lineation", Notation::Lineation},
                {"fault_slip", Notation::FaultSlip},
                {"stress_tensor", Notation::StressTensor},
                {"sphere_grid", Notation::SphereGrid},
                {"slip_sense", Notation::SlipSense}};
  for (const auto &n : kNames)
    if (std::strcmp(name, n.name) == 0) return n.kind;
  const std::string shown = echo_text(name, 60);
  throw Error(ErrorKind::InvalidParameter, "unknown notation \"" + shown + "\"",
              "Accepted: plane, lineation, fault_slip, stress_tensor, sphere_grid, slip_sense.");
}

void copy_utf8_prefix(const char *s, size_t n, char *out, size_t cap) {
  if (cap == 0) return;
  if (n >= cap) {
    n = cap - 1;
    // Back off over UTF-8 continuation bytes (10xxxxxx) so that no character
    // is cut in two; the lead byte of the cut character goes too.
    size_t k = n;
    while (k > 0 && (static_cast<unsigned char>(s[k]) & 0xC0) == 0x80) --k;
    n = k;
  }
  std::memcpy(out, s, n);
  out[n] = '\0';
}

namespace {

// Run the parser of one notation; throws what the parser throws.
void parse_one(Notation kind, const char *text) {
  switch (kind) {
    case Notation::Plane: parse_plane(text); return;
    case Notation::Lineation: parse_line(text); return;
    case Notation::FaultSlip: parse_fault_slip(text); return;
    case Notation::StressTensor: check_stress_tensor(parse_stress_tensor(text)); return;
    case Notation::SphereGrid: {
      // The same steps as sphere_grid input: header, node count, values, ranges.
      const GridHeader h = parse_grid_header(text);
      const int count = grid_node_count(h.spacing);
      std::vector<double> v(static_cast<size_t>(count));
      parse_grid_values(text, h.values_at, v.data(), v.size());
      check_grid(h.kind, h.spacing, h.n, v.data(), v.size());
      return;
    }
    case Notation::SlipSense: parse_sense(text); return;
  }
}

bool starts_with(const char *s, const char *prefix) {
  return std::strncmp(s, prefix, std::strlen(prefix)) == 0;
}

// Turn a parser's error into a reason (check.hpp).
void write_reason(const Error &e, char *reason, size_t cap) {
  // "invalid input syntax for type plane: "<literal>"" says only that the
  // literal (already in the screening output) was bad: the detail says why.
  std::string r;
  if ((starts_with(e.what(), "invalid input syntax") || starts_with(e.what(), "value out of range for type")) &&
      !e.detail.empty())
    r = e.detail;
  else if (!e.detail.empty())
    r = std::string(e.what()) + " (" + e.detail + ")";
  else
    r = e.what();
  copy_utf8_prefix(r.data(), r.size(), reason, cap);
}

}  // namespace

bool check_literal(Notation kind, const char *text, char *reason, size_t cap) {
  try {
    parse_one(kind, text);
    return true;
  } catch (const Error &e) {
    write_reason(e, reason, cap);
    return false;
  }
}

namespace {

bool blank(char c) { return c == ' ' || c == '\t' || c == '\n' || c == '\r'; }
bool letter(char c) { return (c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z'); }

// Blank-separated words of s.
std::vector<std::string> words(const char *s) {
  std::vector<std::string> w;
  std::string cur;
  for (const char *p = s;; ++p) {
    if (*p == '\0' || blank(*p)) {
      if (!cur.empty()) w.push_back(cur);
      cur.clear();
      if (*p == '\0') break;
    } else {
      cur.push_back(*p);
    }
  }
  return w;
}

[[noreturn]] void column_error(const char *column, const std::string &what, const char *text) {
  const std::string shown = echo_text(text, 60);
  throw Error(ErrorKind::InvalidText,
              std::string("invalid ") + column + " column for a fault-slip datum: \"" + shown + "\"", what,
              "Accepted: strike '110' or 'N70W'; dip '64' or '64SW'; an unsigned rake '75' or a pitch "
              "with its strike end '75W'; a sense 'N', 'R', 'D', 'S', a word such as 'normal', or two "
              "('n d', 'reverse-sinistral').");
}

// One field of the literal: no separators, no blanks inside (a dip may carry its
// quadrant after blanks: '64 SW').
std::string one_field(const char *column, const char *text, bool letters_may_follow) {
  for (const char *p = text; *p; ++p)
    if (*p == '/' || *p == ',') column_error(column, "the column holds more than one field", text);
  const std::vector<std::string> w = words(text);
  if (w.empty()) column_error(column, "the column is empty", text);
  if (w.size() == 1) return w[0];
  bool letters_only = w.size() == 2;
  for (char c : w.size() == 2 ? w[1] : std::string("/"))
    if (!letter(c)) letters_only = false;
  if (letters_may_follow && letters_only) return w[0] + w[1];
  column_error(column, "the column holds more than one field", text);
}

}  // namespace

FaultSlip field_fault_slip(const char *strike, const char *dip, const char *rake_or_pitch,
                           const char *sense) {
  const std::string s = one_field("strike", strike, false);
  const std::string d = one_field("dip", dip, true);
  const std::string r = one_field("rake or pitch", rake_or_pitch, false);
  // The sense column is read by the sense parser and written back as letters,
  // so that no word of it can be taken for another field of the literal.
  const Sense sn = parse_sense(sense);
  std::string letters;
  if (sn.dip != 0) letters += sn.dip > 0 ? " n" : " r";
  if (sn.strike != 0) letters += sn.strike > 0 ? " s" : " d";
  const std::string literal = s + "/" + d + "/" + r + letters;
  return parse_fault_slip(literal.c_str());
}

bool check_field_fault_slip(const char *strike, const char *dip, const char *rake_or_pitch,
                            const char *sense, char *reason, size_t cap) {
  try {
    field_fault_slip(strike, dip, rake_or_pitch, sense);
    return true;
  } catch (const Error &e) {
    write_reason(e, reason, cap);
    return false;
  }
}

}  // namespace striae
