// Unit tests of the text notations (src/core/parse.*). Expected values follow
// the conventions in DESIGN.md (right-hand rule, Aki & Richards rake; common
// practice, no source).
#include <gtest/gtest.h>

#include <cstdio>

#include "parse.hpp"

#include <cstdio>
#include <string>

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

template <class F>
ErrorKind kind_of_text(F f, const std::string &text) {
  try {
    f(text.c_str());
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
  // Numbers out of range are 22003 whatever their sign (README, "Errors"):
  // -110 is out of range as 400 is, and as binary input and plane(-110, 64) say.
  EXPECT_EQ(kind_of([] { parse_plane("110/-64"); }), ErrorKind::OutOfRange);
  EXPECT_EQ(kind_of([] { parse_plane("-110/64"); }), ErrorKind::OutOfRange);
  EXPECT_EQ(kind_of([] { parse_plane("400/64"); }), ErrorKind::OutOfRange);
  EXPECT_EQ(kind_of([] { parse_plane("110/95"); }), ErrorKind::OutOfRange);
  EXPECT_EQ(kind_of([] { parse_plane("0/30S"); }), ErrorKind::InvalidText);   // E or W?
  EXPECT_EQ(kind_of([] { parse_plane("30/40NE"); }), ErrorKind::InvalidText); // dips 120 or 300
  EXPECT_EQ(kind_of([] { parse_plane("N70W 64"); }), ErrorKind::InvalidText); // bearing needs letters
  EXPECT_EQ(kind_of([] { parse_plane("N95W 64SW"); }), ErrorKind::OutOfRange);
  EXPECT_EQ(kind_of([] { parse_plane("110/64X"); }), ErrorKind::InvalidText);
  EXPECT_EQ(kind_of([] { parse_plane("110/64 SSW"); }), ErrorKind::InvalidText);
  EXPECT_EQ(kind_of([] { parse_plane("64->"); }), ErrorKind::InvalidText);
  EXPECT_EQ(kind_of([] { parse_plane("110/64;"); }), ErrorKind::InvalidText);
  // Beyond the range of float8 (as '1e309'::float8 and '1e-400'::float8): 22003.
  EXPECT_EQ(kind_of([] { parse_plane("1e999/64"); }), ErrorKind::OutOfRange);
  EXPECT_EQ(kind_of([] { parse_plane("1e309/45"); }), ErrorKind::OutOfRange);
  EXPECT_EQ(kind_of([] { parse_plane("110/1e-400"); }), ErrorKind::OutOfRange);
  EXPECT_PLANE("110/1e-310", 110, 1e-310);  // a subnormal reads as binary input takes it
  EXPECT_PLANE("+110/+64", 110, 64);
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
  EXPECT_EQ(kind_of([] { parse_line("-30->120"); }), ErrorKind::OutOfRange);
  EXPECT_EQ(kind_of([] { parse_line("-120/30"); }), ErrorKind::OutOfRange);
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
  EXPECT_EQ(kind_of([] { parse_fault_slip("110/64/-75 N"); }), ErrorKind::OutOfRange);  // unsigned rake 0..180
  EXPECT_EQ(kind_of([] { parse_fault_slip("110/64/75 D"); }), ErrorKind::InvalidText);   // needs N or R
  EXPECT_EQ(kind_of([] { parse_fault_slip("110/64/75 N D"); }), ErrorKind::InvalidText); // |75| < 90 is sinistral
  EXPECT_EQ(kind_of([] { parse_fault_slip("110/64/0 N"); }), ErrorKind::InvalidText);
  EXPECT_EQ(kind_of([] { parse_fault_slip("110/64/90 S R"); }), ErrorKind::InvalidText);
  EXPECT_EQ(kind_of([] { parse_fault_slip("110/64/75SN"); }), ErrorKind::InvalidText);   // end must be a compass letter
  EXPECT_EQ(kind_of([] { parse_fault_slip("110/64/0W N"); }), ErrorKind::InvalidText);   // horizontal, normal
  EXPECT_EQ(kind_of([] { parse_fault_slip("110/64/95W N"); }), ErrorKind::OutOfRange);  // pitch > 90
  EXPECT_EQ(kind_of([] { parse_fault_slip("110/64/195 N"); }), ErrorKind::OutOfRange);
  EXPECT_EQ(kind_of([] { parse_fault_slip("290/64S/-75"); }), ErrorKind::InvalidText);   // signed rake needs RHR strike
  EXPECT_EQ(kind_of([] { parse_fault_slip("290/64S/75 N"); }), ErrorKind::InvalidText);
  EXPECT_EQ(kind_of([] { parse_fault_slip("0/64/75E N"); }), ErrorKind::InvalidText);    // E is 90 from both ends
  EXPECT_EQ(kind_of([] { parse_fault_slip("110/64/190"); }), ErrorKind::OutOfRange);
  EXPECT_EQ(kind_of([] { parse_fault_slip("64->200"); }), ErrorKind::InvalidText);
  EXPECT_EQ(kind_of([] { parse_fault_slip("110/64/75 N R"); }), ErrorKind::InvalidText);
}

TEST(ParsePlane, DipLetterLimits) {
  // Rule of the README (text notations): two letters name a quadrant, and the
  // dip direction must lie within 45 degrees of its centre, 45 included; one
  // letter names a half, within 90 degrees, 90 excluded. Expected strikes are
  // derived from that rule and the right-hand rule (strike = dip direction - 90).
  // Both limits of every quadrant, exactly and half a degree either side.
  const struct { const char *q; double az; } quads[] = {{"NE", 45}, {"SE", 135}, {"SW", 225}, {"NW", 315}};
  auto lit = [](double strike, const char *q) {
    char buf[64];
    std::snprintf(buf, sizeof buf, "%.1f/30%s", strike, q);
    return std::string(buf);
  };
  for (const auto &q : quads) {
    for (double side : {-1.0, 1.0}) {
      for (double off : {45.0, 44.5, 45.5}) {
        const double dipdir = norm360(q.az + side * off);
        const double rhr = norm360(dipdir - 90.0);
        for (double written : {rhr, norm360(rhr + 180.0)}) {  // either end of the strike line
          const std::string t = lit(written, q.q);
          if (off <= 45.0) {
            EXPECT_PLANE(t.c_str(), rhr, 30);
          } else {
            EXPECT_EQ(kind_of_text(parse_plane, t), ErrorKind::InvalidText) << t;  // neither way
          }
        }
      }
    }
  }
  // One letter: exactly 90 degrees from both dip directions is an error; half a
  // degree off, the nearer dip direction is taken.
  EXPECT_EQ(kind_of([] { parse_plane("0/30S"); }), ErrorKind::InvalidText);
  EXPECT_EQ(kind_of([] { parse_plane("90/30E"); }), ErrorKind::InvalidText);
  EXPECT_PLANE("0.5/30S", 0.5, 30);       // dip directions 090.5 (89.5 from S) and 270.5
  EXPECT_PLANE("359.5/30S", 179.5, 30);   // dip direction 269.5 is 89.5 from S
  EXPECT_PLANE("90.5/30E", 270.5, 30);    // dip direction 000.5 is 89.5 from E
  EXPECT_PLANE("89.5/30E", 89.5, 30);     // dip direction 179.5 is 89.5 from E
}

TEST(ParseLine, BearingLimits) {
  // Quadrant bearings N|S angle E|W with the angle from 0 to 90, both included
  // (README); azimuths by the compass convention (common practice, no source).
  EXPECT_LINE("N90E/30", 90, 30);
  EXPECT_LINE("S90E/30", 90, 30);
  EXPECT_LINE("N90W/30", 270, 30);
  EXPECT_LINE("S90W/30", 270, 30);
  EXPECT_LINE("N0E/30", 0, 30);
  EXPECT_LINE("S0W/30", 180, 30);
  EXPECT_LINE("S10E/30", 170, 30);
  EXPECT_LINE("S10W/30", 190, 30);
  EXPECT_EQ(kind_of([] { parse_line("N90.5E/30"); }), ErrorKind::OutOfRange);  // a value out of its range (22003)
  EXPECT_EQ(kind_of([] { parse_line("S90.5W/30"); }), ErrorKind::OutOfRange);
}

TEST(ParseFault, PitchEndLimits) {
  // The strike end of a pitch follows the dip-letter rule (README): two letters
  // within 45 degrees, 45 included. A pitch psi from the strike end itself with a
  // normal sense has rake -psi, from the other end -(180 - psi) (derived from the
  // Aki & Richards rake, METHODS.md section 1).
  EXPECT_FAULT("0/60/40NE N", 0, 60, -40);       // end 000 is 45 from NE
  EXPECT_FAULT("0.5/60/40NE N", 0.5, 60, -40);   // end 000.5, 44.5 from NE
  EXPECT_FAULT("90/60/40NE N", 90, 60, -40);     // end 090, 45 from NE
  EXPECT_FAULT("89.5/60/40NE N", 89.5, 60, -40);
  EXPECT_FAULT("180/60/40NE N", 180, 60, -140);  // end 000 = strike + 180
  EXPECT_FAULT("180/60/40SW N", 180, 60, -40);   // end 180, 45 from SW
  EXPECT_FAULT("270/60/40SE R", 270, 60, 40);    // end 090 = strike + 180, reverse: u = cos psi s - sin psi dd
  EXPECT_EQ(kind_of([] { parse_fault_slip("359.5/60/40NE N"); }), ErrorKind::InvalidText);  // ends 45.5 and 134.5 away
  EXPECT_EQ(kind_of([] { parse_fault_slip("90.5/60/40NE N"); }), ErrorKind::InvalidText);
  EXPECT_EQ(kind_of([] { parse_fault_slip("0/60/40E N"); }), ErrorKind::InvalidText);      // one letter, 90 from both
  EXPECT_FAULT("0.5/60/40E N", 0.5, 60, -40);                                             // end 000.5 is 89.5 from E
}

TEST(ParseMisc, Compass) {
  EXPECT_EQ(compass_azimuth("n", 1), 0);
  EXPECT_EQ(compass_azimuth("sw", 2), 225);
  EXPECT_LT(compass_azimuth("x", 1), 0);
  EXPECT_LT(compass_azimuth("ns", 2), 0);
}

// The rake goes with the strike as written (found comparing text and binary
// input): a vertical plane written with strike 270 is stored as 90/90 with the
// rake negated, and a horizontal plane re-measures the rake from strike 0,
// exactly as make_fault_slip (binary input, fault_slip(s, d, r)) does.
TEST(ParseFault, CanonicalAsBinaryInput) {
  EXPECT_FAULT("270/90/30", 90, 90, -30);
  EXPECT_FAULT("90/0/30", 0, 0, -60);
  EXPECT_FAULT("270/90/120 R", 90, 90, -120);
  EXPECT_FAULT("270/90/60 R", 90, 90, -60);
  const double cases[][3] = {{270, 90, 30}, {90, 0, 30}, {200, 90, -179}, {359, 0, 180}, {180, 90, 0},
                             {270, 90, 60}, {360, 45, -90}};
  for (const auto &c : cases) {
    char txt[100];
    std::snprintf(txt, sizeof txt, "%.17g/%.17g/%.17g", c[0], c[1], c[2]);
    const FaultSlip t = parse_fault_slip(txt), b = make_fault_slip(c[0], c[1], c[2]);
    EXPECT_EQ(t.strike, b.strike) << txt;
    EXPECT_EQ(t.dip, b.dip) << txt;
    EXPECT_EQ(t.rake, b.rake) << txt;
  }
}

// Error messages quote whole characters and cut long text at a character
// boundary (U+00A0 no-break space is C2 A0, the degree sign C2 B0).
TEST(ParseErrors, QuoteWholeCharacters) {
  try {
    parse_plane("110/64\xC2\xA0SW");
    FAIL();
  } catch (const Error &e) {
    EXPECT_NE(e.detail.find("'\xC2\xA0'"), std::string::npos) << e.detail;
  }
  try {
    parse_line("\xE2\x82\xAC" "120/30");  // euro sign first
    FAIL();
  } catch (const Error &e) {
    EXPECT_NE(e.detail.find("'\xE2\x82\xAC'"), std::string::npos) << e.detail;
  }
  std::string longtext = "110/";
  for (int i = 0; i < 300; ++i) longtext += "\xC2\xB0";  // degree signs, 2 bytes each
  try {
    parse_plane(longtext.c_str());
    FAIL();
  } catch (const Error &e) {
    const std::string m = e.what();
    EXPECT_LT(m.size(), kEchoBytes + 60);
    const size_t q = m.find('"');
    // Between the quotes: "110/", then whole degree signs, then "...".
    const std::string shown = m.substr(q + 1, m.rfind('"') - q - 1);
    ASSERT_GE(shown.size(), 7u);
    EXPECT_EQ(shown.substr(shown.size() - 3), "...");
    EXPECT_EQ((shown.size() - 3 - 4) % 2, 0u) << shown;
  }
}

TEST(EchoText, CutsAtCharacters) {
  EXPECT_EQ(echo_text("abc", 3), "abc");
  EXPECT_EQ(echo_text("abcd", 3), "abc...");
  EXPECT_EQ(echo_text("a\xC2\xB0" "b", 2), "a...");         // the degree sign does not fit
  EXPECT_EQ(echo_text("a\xC2\xB0" "b", 3), "a\xC2\xB0...");
  EXPECT_EQ(echo_text("\xF0\x9F\x98\x80x", 3), "...");  // a 4-byte character
  EXPECT_EQ(echo_text("\xFF\xFE\xFD", 2), "\xFF\xFE...");  // not UTF-8: byte by byte
  const char s[] = "\xE2\x82";  // a cut sequence is not a character: one byte
  EXPECT_EQ(char_length(s, s + 2), 1u);
  const char t[] = "\xED\xA0\x80";  // a UTF-16 surrogate is not UTF-8
  EXPECT_EQ(char_length(t, t + 3), 1u);
  const char u[] = "\xE2\x82\xAC";
  EXPECT_EQ(char_length(u, u + 3), 3u);
}
