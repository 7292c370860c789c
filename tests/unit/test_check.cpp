// Unit tests of the literal checks, the field-book constructor (src/core/check.*)
// and the fixed-precision display (src/core/display.*). Expected orientations
// follow the conventions of DESIGN.md (right-hand rule, Aki & Richards rake;
// common practice, no source); display rules are striae's own (display.hpp).
#include <gtest/gtest.h>

#include <cstring>
#include <vector>

#include "check.hpp"
#include "display.hpp"
#include "grid.hpp"
#include "parse.hpp"
#include "stress_text.hpp"

using namespace striae;

namespace {

// The check must agree with the parser on every literal: valid exactly when
// the parser accepts it, and the reason must be what the parser said.
void expect_agrees(Notation kind, const char *text) {
  char reason[512];
  const bool ok = check_literal(kind, text, reason, sizeof reason);
  std::string parser_says;
  bool parser_ok = true;
  try {
    switch (kind) {
      case Notation::Plane: parse_plane(text); break;
      case Notation::Lineation: parse_line(text); break;
      case Notation::FaultSlip: parse_fault_slip(text); break;
      case Notation::SlipSense: parse_sense(text); break;
      default: FAIL();
    }
  } catch (const Error &e) {
    parser_ok = false;
    parser_says = e.detail.empty() ? e.what() : e.detail;
  }
  EXPECT_EQ(ok, parser_ok) << text;
  if (!ok) {
    EXPECT_NE(std::string(reason).find(parser_says), std::string::npos) << text << ": " << reason;
  }
}

}  // namespace

TEST(Check, AgreesWithTheParsers) {
  for (const char *t : {"110/64", "290/64S", "N70W 64SW", "200/64 dd", "64->200", "110/64X", "110/95", "",
                        "0/30S", "30/40NE", "110/64/3"})
    expect_agrees(Notation::Plane, t);
  for (const char *t : {"120/30", "300/-30", "S60E/30", "30->120", "120", "120/30/1", "400/10", "n70x/10"})
    expect_agrees(Notation::Lineation, t);
  for (const char *t : {"110/64/-75", "110/64/75 N", "110/64/75W N", "110/64/75", "110/64/75 Q",
                        "290/64S/-75", "110/64/200"})
    expect_agrees(Notation::FaultSlip, t);
  for (const char *t : {"n", "normal-dextral", "n d", "nd", "up", "normal reverse", ""})
    expect_agrees(Notation::SlipSense, t);
}

TEST(Check, ReasonsSayWhatWasWrong) {
  char reason[256];
  // A syntax error: the detail (the literal is already known to the caller).
  ASSERT_FALSE(check_literal(Notation::Plane, "110/64X", reason, sizeof reason));
  EXPECT_STREQ(reason, "\"X\" is not a dip quadrant (use N, NE, E, SE, S, SW, W or NW)");
  // A range error: message and what is accepted.
  ASSERT_FALSE(check_literal(Notation::Plane, "110/95", reason, sizeof reason));
  EXPECT_STREQ(reason, "dip 95 is out of range (Accepted: dip from 0 to 90 degrees.)");
  // stress_tensor: syntax, then the value checks (trace 0, unit norm).
  EXPECT_TRUE(check_literal(Notation::StressTensor,
                            "{\"components\": [0.5, -0.5, 0, 0.5, 0, 0], \"n\": 0}", reason, sizeof reason))
      << reason;
  ASSERT_FALSE(check_literal(Notation::StressTensor, "{\"components\": [1, 0, 0, 0, 0, 0], \"n\": 1}", reason,
                             sizeof reason));
  EXPECT_NE(std::string(reason).find("trace"), std::string::npos) << reason;
  ASSERT_FALSE(check_literal(Notation::StressTensor, "{\"n\": 1}", reason, sizeof reason));
  // sphere_grid: node count of the spacing (45 degrees: rings of 4, 6 and 1 nodes,
  // the horizontal one over trends [0, 180) only; grid.hpp).
  EXPECT_EQ(grid_node_count(45), 4 + 6 + 1);
  EXPECT_TRUE(check_literal(Notation::SphereGrid,
                            "{\"kind\": \"density\", \"spacing\": 45, \"n\": 3, \"values\": [1,1,1,1,1,1,1,1,1,1,1]}",
                            reason, sizeof reason))
      << reason;
  ASSERT_FALSE(check_literal(Notation::SphereGrid,
                             "{\"kind\": \"density\", \"spacing\": 45, \"n\": 3, \"values\": [1,1,1]}", reason,
                             sizeof reason));
  EXPECT_NE(std::string(reason).find("only 3 values"), std::string::npos) << reason;
  ASSERT_FALSE(check_literal(Notation::SphereGrid,
                             "{\"kind\": \"right_dihedra\", \"spacing\": 45, \"n\": 3, \"values\": "
                             "[1,1,1,1,1,1,1,1,1,1,101]}",
                             reason, sizeof reason));
  EXPECT_NE(std::string(reason).find("0 to 100"), std::string::npos) << reason;
}

TEST(Check, NotationNames) {
  EXPECT_EQ(notation_named("fault_slip"), Notation::FaultSlip);
  EXPECT_EQ(notation_named("slip_sense"), Notation::SlipSense);
  try {
    notation_named("planes");
    FAIL();
  } catch (const Error &e) {
    EXPECT_EQ(e.kind, ErrorKind::InvalidParameter);
  }
}

TEST(Check, Utf8PrefixNeverSplitsACharacter) {
  char out[8];
  // "ab" then e-acute (C3 A9): a cut after 3 bytes would split it.
  copy_utf8_prefix("ab\xC3\xA9z", 5, out, 4);
  EXPECT_STREQ(out, "ab");
  copy_utf8_prefix("ab\xC3\xA9z", 5, out, 5);
  EXPECT_STREQ(out, "ab\xC3\xA9");
  // A three-byte arrow (E2 86 92) cut in its middle goes whole.
  copy_utf8_prefix("a\xE2\x86\x92", 4, out, 3);
  EXPECT_STREQ(out, "a");
  copy_utf8_prefix("abc", 3, out, 8);
  EXPECT_STREQ(out, "abc");
}

TEST(FieldBook, SameAsTheTextNotation) {
  // The README's own examples of the fault_slip notation, given as columns.
  auto same = [](const char *s, const char *d, const char *r, const char *sense, const char *literal) {
    const FaultSlip a = field_fault_slip(s, d, r, sense), b = parse_fault_slip(literal);
    EXPECT_EQ(a.strike, b.strike) << literal;
    EXPECT_EQ(a.dip, b.dip) << literal;
    EXPECT_EQ(a.rake, b.rake) << literal;
  };
  same("110", "64", "75", "N", "110/64/-75");
  same("110", "64", "75", "normal", "110/64/-75");
  same("110", "64", "75W", "N", "110/64/-105");
  same("N70W", "64 SW", "75W", "R", "110/64/75");
  same("290", "64S", "75W", "n", "110/64/-105");
  same("110", "64", "120", "normal-dextral", "110/64/-120");
  same("110", "64", "0", "left-lateral", "110/64/0");
  same("110", "64", "180", "D", "110/64/180");
  same(" 110 ", "64", "75", " r ", "110/64/75");
}

TEST(FieldBook, ColumnErrorsNameTheColumn) {
  char reason[512];
  ASSERT_FALSE(check_field_fault_slip("110/64", "64", "75", "n", reason, sizeof reason));
  EXPECT_NE(std::string(reason).find("strike column"), std::string::npos) << reason;
  ASSERT_FALSE(check_field_fault_slip("110", "64", "75 W", "n", reason, sizeof reason));
  EXPECT_NE(std::string(reason).find("rake or pitch column"), std::string::npos) << reason;
  ASSERT_FALSE(check_field_fault_slip("110", "", "75", "n", reason, sizeof reason));
  EXPECT_NE(std::string(reason).find("empty"), std::string::npos) << reason;
  // The sense column goes through the sense parser: a pitch cannot hide in it.
  ASSERT_FALSE(check_field_fault_slip("110", "64", "75", "75W n", reason, sizeof reason));
  // The rules of the notation hold: an unsigned rake needs N or R.
  ASSERT_FALSE(check_field_fault_slip("110", "64", "75", "d", reason, sizeof reason));
  EXPECT_NE(std::string(reason).find("N or R"), std::string::npos) << reason;
  // Rake 0 is sinistral (|rake| < 90, DESIGN.md): a dextral sense contradicts it.
  ASSERT_FALSE(check_field_fault_slip("110", "64", "0", "d", reason, sizeof reason));
  EXPECT_STREQ(reason, "the slip sense contradicts the rake");
  EXPECT_TRUE(check_field_fault_slip("110", "64", "180", "d", reason, sizeof reason)) << reason;
}

TEST(Display, RoundsAndPads) {
  EXPECT_EQ(display(Plane{110, 64}, 0), "110/64");
  EXPECT_EQ(display(Line{20.4, 26.6}, 0), "020/27");
  EXPECT_EQ(display(Line{20.4, 5.04}, 1), "020.4/05.0");
  EXPECT_EQ(display(Line{359.6, 5}, 0), "000/05");     // 360 is 000
  EXPECT_EQ(display(Plane{359.96, 5}, 1), "000.0/05.0");
  EXPECT_EQ(display(FaultSlip{110, 64, -179.8}, 0), "110/64/180");  // rake -180 is 180
  EXPECT_EQ(display(FaultSlip{110, 64, -0.2}, 0), "110/64/0");      // no "-0"
  EXPECT_EQ(display(FaultSlip{110.123456, 64.5, -75}, 2), "110.12/64.50/-75.00");
  EXPECT_EQ(display(Line{0, 90}, 0), "000/90");
  try {
    display(Plane{1, 1}, 11);
    FAIL();
  } catch (const Error &e) {
    EXPECT_EQ(e.kind, ErrorKind::InvalidParameter);
  }
  EXPECT_THROW(display(Plane{1, 1}, -1), Error);
}

TEST(Display, StressTensorWithCountAndMisfit) {
  // display.hpp: the three axes, phi with two more decimals than the angles, then
  // ', n N' for a tensor from data and ', misfit M' when the mean misfit is defined.
  // An Andersonian strike-slip state (sigma1 040/00, sigma3 130/00, vertical sigma2).
  StressTensor t = stress_from_axes(Line{40, 0}, Line{130, 0}, 0.3);
  EXPECT_EQ(display(t, 0), "sigma1 040/00, sigma2 000/90, sigma3 130/00, phi 0.30");
  t.data_count = 12;
  EXPECT_EQ(display(t, 0), "sigma1 040/00, sigma2 000/90, sigma3 130/00, phi 0.30, n 12");
  t.mean_misfit = 4.46;
  t.flags |= kStressHasMisfit;
  EXPECT_EQ(display(t, 1), "sigma1 040.0/00.0, sigma2 000.0/90.0, sigma3 130.0/00.0, phi 0.300, n 12, misfit 4.5");
}

TEST(Display, StressTensorSummary) {
  // Axes of a forward tensor are the given ones (derived from the construction).
  const StressTensor t = stress_from_axes(make_line(40, 0), make_line(130, 0), 0.3);
  EXPECT_EQ(display(t, 0), "sigma1 040/00, sigma2 000/90, sigma3 130/00, phi 0.30");
  EXPECT_EQ(display(t, 1), "sigma1 040.0/00.0, sigma2 000.0/90.0, sigma3 130.0/00.0, phi 0.300");
}

TEST(Display, GridStaysALiteral) {
  const int count = grid_node_count(45);
  std::vector<double> v(static_cast<size_t>(count));
  for (int k = 0; k < count; ++k) v[k] = 100.0 * k / (count - 1);  // 0 .. 100 percent
  const std::string s = display_grid("right_dihedra", 45, 12, v.data(), v.size(), 1);
  EXPECT_EQ(s.rfind("{\"kind\": \"right_dihedra\", \"spacing\": 45, \"n\": 12, \"values\": [0.0, 10.0, ", 0), 0u) << s;
  EXPECT_EQ(s.substr(s.size() - 7), "100.0]}") << s;
  char reason[256];
  EXPECT_TRUE(check_literal(Notation::SphereGrid, s.c_str(), reason, sizeof reason)) << reason;
}
