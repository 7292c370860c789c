// Unit tests of the text notations (src/core/parse.*). Expected values follow
// the conventions in DESIGN.md (right-hand rule, Aki & Richards rake; common
// practice, no source).
#include <gtest/gtest.h>

#include "parse.hpp"

using namespace striae;

namespace {

ErrorKind kind_of(void (*f)()) {
  try {
    f();
  } catch (const Error &e) {
    return e.kind;
  }
  return static_cast<ErrorKind>(-1);
}

#define EXPECT_PLANE(txt, s, d)          \
  do {                                   \
    Plane p_ = parse_plane(txt);         \
    EXPECT_DOUBLE_EQ(p_.strike, s) << txt; \
    EXPECT_DOUBLE_EQ(p_.dip, d) << txt;  \
  } while (0)

#define EXPECT_LINE(txt, t, p)            \
  do {                                    \
    Line l_ = parse_line(txt);            \
    EXPECT_DOUBLE_EQ(l_.trend, t) << txt; \
    EXPECT_DOUBLE_EQ(l_.plunge, p) << txt; \
  } while (0)

#define EXPECT_FAULT(txt, s, d, r)         \
  do {                                     \
    FaultSlip f_ = parse_fault_slip(txt);  \
    EXPECT_NEAR(f_.strike, s, 1e-9) << txt; \
    EXPECT_NEAR(f_.dip, d, 1e-9) << txt;   \
    EXPECT_NEAR(f_.rake, r, 1e-9) << txt;  \
  } while (0)

}  // namespace

TEST(ParsePlane, Forms) {
  EXPECT_PLANE("110/64", 110, 64);
  EXPECT_PLANE("  110 / 64 ", 110, 64);
  EXPECT_PLANE("110,64", 110, 64);
  EXPECT_PLANE("110 64", 110, 64);
  EXPECT_PLANE("110°/64°", 110, 64);
  EXPECT_PLANE("290/64S", 110, 64);     // dips SSW: RHR strike 110
  EXPECT_PLANE("110/64 SW", 110, 64);
  EXPECT_PLANE("290/64 sw", 110, 64);
  EXPECT_PLANE("110/64N", 290, 64);     // letter flips the strike
  EXPECT_PLANE("N70W 64SW", 110, 64);   // bearing N70W = 290
  EXPECT_PLANE("N70W/64SW", 110, 64);
  EXPECT_PLANE("S70E, 64 SW", 110, 64); // bearing S70E = 110
  EXPECT_PLANE("N30E 40SE", 30, 40);    // dip direction 120 lies in SE
  EXPECT_PLANE("200/64 dd", 110, 64);
  EXPECT_PLANE("200/64DD", 110, 64);
  EXPECT_PLANE("64->200", 110, 64);
  EXPECT_PLANE("64 \xE2\x86\x92 200", 110, 64);
  EXPECT_PLANE("1.5e1/6.4E1", 15, 64);
  EXPECT_PLANE("+110/64", 110, 64);
  EXPECT_PLANE("270/90", 90, 90);
  EXPECT_PLANE("33/0", 0, 0);
}

TEST(ParsePlane, Errors) {
  EXPECT_EQ(kind_of([] { parse_plane(""); }), ErrorKind::InvalidText);
  EXPECT_EQ(kind_of([] { parse_plane("110"); }), ErrorKind::InvalidText);
  EXPECT_EQ(kind_of([] { parse_plane("110/64/3"); }), ErrorKind::InvalidText);
  EXPECT_EQ(kind_of([] { parse_plane("110//64"); }), ErrorKind::InvalidText);
  EXPECT_EQ(kind_of([] { parse_plane("nan/64"); }), ErrorKind::InvalidText);
  EXPECT_EQ(kind_of([] { parse_plane("inf/64"); }), ErrorKind::InvalidText);
  EXPECT_EQ(kind_of([] { parse_plane("110/-64"); }), ErrorKind::InvalidText);
  EXPECT_EQ(kind_of([] { parse_plane("-110/64"); }), ErrorKind::InvalidText);
  EXPECT_EQ(kind_of([] { parse_plane("400/64"); }), ErrorKind::OutOfRange);
  EXPECT_EQ(kind_of([] { parse_plane("110/95"); }), ErrorKind::OutOfRange);
  EXPECT_EQ(kind_of([] { parse_plane("0/30S"); }), ErrorKind::InvalidText);   // E or W?
  EXPECT_EQ(kind_of([] { parse_plane("30/40NE"); }), ErrorKind::InvalidText); // dips 120 or 300
  EXPECT_EQ(kind_of([] { parse_plane("N70W 64"); }), ErrorKind::InvalidText); // bearing needs letters
  EXPECT_EQ(kind_of([] { parse_plane("N95W 64SW"); }), ErrorKind::InvalidText);
  EXPECT_EQ(kind_of([] { parse_plane("110/64X"); }), ErrorKind::InvalidText);
  EXPECT_EQ(kind_of([] { parse_plane("110/64 SSW"); }), ErrorKind::InvalidText);
  EXPECT_EQ(kind_of([] { parse_plane("64->"); }), ErrorKind::InvalidText);
  EXPECT_EQ(kind_of([] { parse_plane("110/64;"); }), ErrorKind::InvalidText);
  EXPECT_EQ(kind_of([] { parse_plane("1e999/64"); }), ErrorKind::InvalidText);
}

TEST(ParseLine, Forms) {
  EXPECT_LINE("120/30", 120, 30);
  EXPECT_LINE("300/-30", 120, 30);
  EXPECT_LINE("30->120", 120, 30);
  EXPECT_LINE("30->S60E", 120, 30);
  EXPECT_LINE("S60E/30", 120, 30);
  EXPECT_LINE("N60W/30", 300, 30);
  EXPECT_LINE("200/0", 20, 0);
  EXPECT_LINE("45/90", 0, 90);
}

TEST(ParseLine, Errors) {
  EXPECT_EQ(kind_of([] { parse_line("120"); }), ErrorKind::InvalidText);
  EXPECT_EQ(kind_of([] { parse_line("120/30/4"); }), ErrorKind::InvalidText);
  EXPECT_EQ(kind_of([] { parse_line("120/30SE"); }), ErrorKind::InvalidText);
  EXPECT_EQ(kind_of([] { parse_line("-30->120"); }), ErrorKind::InvalidText);
  EXPECT_EQ(kind_of([] { parse_line("120/91"); }), ErrorKind::OutOfRange);
  EXPECT_EQ(kind_of([] { parse_line("361/30"); }), ErrorKind::OutOfRange);
}

TEST(ParseFault, Forms) {
  EXPECT_FAULT("110/64/-75", 110, 64, -75);
  EXPECT_FAULT("110/64/-180", 110, 64, 180);
  EXPECT_FAULT("110/64/75 N", 110, 64, -75);
  EXPECT_FAULT("110/64/75 R", 110, 64, 75);
  EXPECT_FAULT("110/64/75 T", 110, 64, 75);
  EXPECT_FAULT("110/64/75/normal", 110, 64, -75);
  EXPECT_FAULT("110/64/75 SN", 110, 64, -75);   // sinistral consistent with |rake| < 90
  EXPECT_FAULT("110/64/0 S", 110, 64, 0);
  EXPECT_FAULT("110/64/180 D", 110, 64, 180);
  // Pitch 75 from the WNW end (290), normal: the hanging wall moves down and
  // toward 290, against the strike direction: dextral, rake -105.
  EXPECT_FAULT("110/64/75W N", 110, 64, -105);
  EXPECT_FAULT("110/64/75E N", 110, 64, -75);
  EXPECT_FAULT("110/64SW/75W/N", 110, 64, -105);
  EXPECT_FAULT("N70W 64SW/75W R", 110, 64, 75);
  EXPECT_FAULT("290/64S/90E R", 110, 64, 90);
  EXPECT_FAULT("110/64/0W D", 110, 64, 180);     // horizontal toward 290: dextral
  EXPECT_FAULT("110/64/30E S N", 110, 64, -30);
  EXPECT_FAULT("110/64/75", 110, 64, 75);
}

TEST(ParseFault, Errors) {
  EXPECT_EQ(kind_of([] { parse_fault_slip("110/64"); }), ErrorKind::InvalidText);
  EXPECT_EQ(kind_of([] { parse_fault_slip("110/64/75 X"); }), ErrorKind::InvalidText);
  EXPECT_EQ(kind_of([] { parse_fault_slip("110/64/30E D N"); }), ErrorKind::InvalidText);
  EXPECT_EQ(kind_of([] { parse_fault_slip("110/64/-75 N"); }), ErrorKind::InvalidText);
  EXPECT_EQ(kind_of([] { parse_fault_slip("110/64/75 D"); }), ErrorKind::InvalidText);   // needs N or R
  EXPECT_EQ(kind_of([] { parse_fault_slip("110/64/75 N D"); }), ErrorKind::InvalidText); // |75| < 90 is sinistral
  EXPECT_EQ(kind_of([] { parse_fault_slip("110/64/0 N"); }), ErrorKind::InvalidText);
  EXPECT_EQ(kind_of([] { parse_fault_slip("110/64/90 S R"); }), ErrorKind::InvalidText);
  EXPECT_EQ(kind_of([] { parse_fault_slip("110/64/75SN"); }), ErrorKind::InvalidText);   // end must be a compass letter
  EXPECT_EQ(kind_of([] { parse_fault_slip("110/64/0W N"); }), ErrorKind::InvalidText);   // horizontal, normal
  EXPECT_EQ(kind_of([] { parse_fault_slip("110/64/95W N"); }), ErrorKind::InvalidText);  // pitch > 90
  EXPECT_EQ(kind_of([] { parse_fault_slip("290/64S/-75"); }), ErrorKind::InvalidText);   // signed rake needs RHR strike
  EXPECT_EQ(kind_of([] { parse_fault_slip("290/64S/75 N"); }), ErrorKind::InvalidText);
  EXPECT_EQ(kind_of([] { parse_fault_slip("0/64/75E N"); }), ErrorKind::InvalidText);    // E is 90 from both ends
  EXPECT_EQ(kind_of([] { parse_fault_slip("110/64/190"); }), ErrorKind::OutOfRange);
  EXPECT_EQ(kind_of([] { parse_fault_slip("64->200"); }), ErrorKind::InvalidText);
  EXPECT_EQ(kind_of([] { parse_fault_slip("110/64/75 N R"); }), ErrorKind::InvalidText);
}

TEST(ParseMisc, Compass) {
  EXPECT_EQ(compass_azimuth("n", 1), 0);
  EXPECT_EQ(compass_azimuth("sw", 2), 225);
  EXPECT_LT(compass_azimuth("x", 1), 0);
  EXPECT_LT(compass_azimuth("ns", 2), 0);
}
