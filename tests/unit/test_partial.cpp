// Unit tests of src/core/partial: the partial_state value (header, validation,
// text form, binary check), base64 against the test vectors of RFC 4648
// section 10, and the merge rules. Data are invented (synthetic round trips).
#include "agg_state.hpp"
#include "density.hpp"
#include "partial.hpp"
#include "phases.hpp"

#include <gtest/gtest.h>

#include <cstring>
#include <string>
#include <vector>

using namespace striae;

namespace {

using Bytes = std::vector<unsigned char>;

template <class F>
Error error_of(F &&f) {
  try {
    f();
  } catch (const Error &e) {
    return e;
  }
  ADD_FAILURE() << "no error";
  return Error(ErrorKind::DataError, "none");
}

std::vector<FaultSlip> faults(int n) {
  std::vector<FaultSlip> v;
  for (int i = 1; i <= n; ++i) v.push_back(make_fault_slip((i * 29) % 360, 20 + (i * 11) % 60, (i * 47) % 360 - 180));
  return v;
}

// A partial value: header, then the serialized state.
Bytes with_header(StateKind k, PartialInput in, const Bytes &state) {
  Bytes b(kPartialHeader);
  write_partial_header(k, in, b.data());
  b.insert(b.end(), state.begin(), state.end());
  return b;
}

Bytes stress_partial(int n) {
  StressAccum s;
  stress_init(s);
  for (const FaultSlip &f : faults(n)) stress_add_fault(s, f);
  Bytes st(kStressSerialSize);
  write_stress_state(s, st.data());
  return with_header(StateKind::StressLinear, PartialInput::FaultSlip, st);
}

Bytes fisher_partial(int n, PartialInput in) {
  FisherState s;
  fisher_init(s);
  for (int i = 1; i <= n; ++i) fisher_add(s, line_vector(make_line((i * 37) % 360, (i * 13) % 90)));
  Bytes st(kFisherSerialSize);
  write_fisher_state(s, st.data());
  return with_header(StateKind::Fisher, in, st);
}

Bytes density_partial(double spacing, int n) {
  std::vector<uint32_t> ids;
  std::vector<uint64_t> counts;
  for (int i = 1; i <= n; ++i) {
    ids.push_back(density_bin(line_vector(make_line((i * 37) % 360, (i * 13) % 90))));
    counts.push_back(1);
  }
  const size_t m = compact_bins(ids.data(), counts.data(), ids.size());
  Bytes st(density_serial_size(m));
  write_density_state(spacing, ids.data(), counts.data(), m, st.data());
  return with_header(StateKind::Density, PartialInput::Lineation, st);
}

Bytes keep_partial(int32_t kind, double friction, int32_t resamples, int64_t seed, int n) {
  std::vector<SlipDatum> d;
  for (const FaultSlip &f : faults(n)) d.push_back(slip_datum(f));
  const KeepParams h{kind, resamples, seed, friction, static_cast<int64_t>(d.size())};
  Bytes st(keep_serial_size(h.count));
  write_keep_state(h, d.data(), st.data());
  return with_header(keep_state_kind(kind), PartialInput::FaultSlip, st);
}

Bytes misfit_partial(double threshold, std::vector<double> v, int64_t undefined) {
  const MisfitParams h{threshold, undefined, static_cast<int64_t>(v.size())};
  Bytes st(misfit_serial_size(h.count));
  write_misfit_state(h, v.data(), st.data());
  return with_header(StateKind::MisfitSummary, PartialInput::FaultSlip, st);
}

Bytes moment_partial(int n, bool weighted) {
  MomentAccum s;
  moment_init(s);
  for (const FaultSlip &f : faults(n)) moment_add(s, f, weighted ? 1e15 : 1.0, weighted);
  Bytes st(kMomentSerialSize);
  write_moment_state(s, st.data());
  return with_header(StateKind::MomentSum, PartialInput::FaultSlip, st);
}

std::string text_of(const Bytes &b) {
  std::string s(partial_text_size(b.data(), b.size()) + 1, '\0');
  write_partial_text(b.data(), b.size(), s.data());
  s.resize(s.size() - 1);
  return s;
}

// Text input as the glue runs it: scan, allocate, decode.
Bytes from_text(const std::string &s) {
  const PartialText t = scan_partial_text(s.c_str());
  Bytes b(t.size);
  decode_partial_text(s.c_str(), t, b.data());
  return b;
}

std::string b64(const std::string &s) {
  std::string out(base64_size(s.size()), '\0');
  base64_encode(reinterpret_cast<const unsigned char *>(s.data()), s.size(), out.data());
  return out;
}

bool b64_decodes(const std::string &s, std::string *out = nullptr) {
  std::vector<unsigned char> buf(s.size());
  size_t n = 0;
  if (!base64_decode(s.data(), s.size(), buf.data(), n)) return false;
  if (out) *out = std::string(buf.begin(), buf.begin() + static_cast<long>(n));
  return true;
}

}  // namespace

// ---- base64 --------------------------------------------------------------------------------

TEST(PartialBase64, Rfc4648TestVectors) {
  // RFC 4648 (2006) section 10, the published test vectors.
  const std::pair<const char *, const char *> v[] = {{"", ""},         {"f", "Zg=="},         {"fo", "Zm8="},
                                                     {"foo", "Zm9v"}, {"foob", "Zm9vYg=="}, {"fooba", "Zm9vYmE="},
                                                     {"foobar", "Zm9vYmFy"}};
  for (const auto &[plain, enc] : v) {
    EXPECT_EQ(b64(plain), enc);
    std::string back;
    ASSERT_TRUE(b64_decodes(enc, &back)) << enc;
    EXPECT_EQ(back, plain);
  }
  // every byte value through the two 6-bit alphabets' ends (+ and /)
  std::string all;
  for (int c = 0; c < 256; ++c) all += static_cast<char>(c);
  std::string back;
  ASSERT_TRUE(b64_decodes(b64(all), &back));
  EXPECT_EQ(back, all);
}

TEST(PartialBase64, StrictDecoding) {
  EXPECT_FALSE(b64_decodes("Zg="));        // length not a multiple of 4
  EXPECT_FALSE(b64_decodes("Zh=="));       // unused bits not zero ("Zg==" is the one text of "f")
  EXPECT_FALSE(b64_decodes("Zm9="));      // likewise for two bytes ("Zm8=")
  EXPECT_FALSE(b64_decodes("Zg==Zg=="));  // padding before the end
  EXPECT_FALSE(b64_decodes("Z=g="));       // a character after '='
  EXPECT_FALSE(b64_decodes("Zm9v\nYmFy")); // line breaks are not accepted
  EXPECT_FALSE(b64_decodes("Zm9-"));       // URL-safe alphabet is not this one
  EXPECT_FALSE(b64_decodes("===="));
  EXPECT_TRUE(b64_decodes("Zm9v"));
}

// ---- values -------------------------------------------------------------------------------

TEST(Partial, InfoOfEachKind) {
  PartialInfo i = check_partial(stress_partial(9).data(), stress_partial(9).size(), "t");
  EXPECT_EQ(i.kind, StateKind::StressLinear);
  EXPECT_EQ(i.input, PartialInput::FaultSlip);
  EXPECT_EQ(i.count, 9);
  const Bytes f = fisher_partial(7, PartialInput::Plane);
  i = check_partial(f.data(), f.size(), "t");
  EXPECT_EQ(i.kind, StateKind::Fisher);
  EXPECT_EQ(i.input, PartialInput::Plane);
  EXPECT_EQ(i.count, 7);
  const Bytes d = density_partial(10, 40);
  i = check_partial(d.data(), d.size(), "t");
  EXPECT_EQ(i.count, 40);  // the sum of the bins
  EXPECT_EQ(i.spacing, 10);
  const Bytes k = keep_partial(kKeepFocalBootstrap, 0.6, 20, 3, 12);
  i = check_partial(k.data(), k.size(), "t");
  EXPECT_EQ(i.kind, StateKind::KeepFocalBootstrap);
  EXPECT_EQ(i.count, 12);
  EXPECT_EQ(i.friction, 0.6);
  EXPECT_EQ(i.resamples, 20);
  EXPECT_EQ(i.seed, 3);
  const Bytes m = misfit_partial(20, {1, 30, 179.5}, 2);
  i = check_partial(m.data(), m.size(), "t");
  EXPECT_EQ(i.count, 5);  // defined and undefined
  EXPECT_EQ(i.threshold, 20);
  const Bytes mt = moment_partial(4, true);
  i = check_partial(mt.data(), mt.size(), "t");
  EXPECT_EQ(i.weighted, 1);
  EXPECT_EQ(i.count, 4);
}

TEST(Partial, HeaderRejections) {
  const Bytes good = stress_partial(5);
  auto rejected = [](Bytes b, const char *what) {
    const Error e = error_of([&] { check_partial(b.data(), b.size(), "fn"); });
    EXPECT_EQ(e.kind, ErrorKind::BadState) << what;
    EXPECT_EQ(std::string(e.what()).rfind("fn: ", 0), 0u) << e.what();
  };
  Bytes b = good;
  b[0] ^= 1;  // magic
  rejected(b, "magic");
  b = good;
  const uint32_t figure = static_cast<uint32_t>(StateKind::FigureLayer);
  std::memcpy(b.data() + 4, &figure, 4);  // a kind partials do not carry
  rejected(b, "figure kind");
  b = good;
  const uint32_t plane = static_cast<uint32_t>(PartialInput::Plane);
  std::memcpy(b.data() + 8, &plane, 4);  // stress partial of planes
  rejected(b, "pair");
  b = good;
  b[12] = 1;  // reserved
  rejected(b, "reserved");
  b = good;
  b.resize(b.size() - 1);  // truncated
  rejected(b, "truncated");
  b = good;
  b.push_back(0);  // trailing byte
  rejected(b, "trailing");
  rejected(Bytes(good.begin(), good.begin() + 19), "too short");
  // the header says fisher, the state is a stress state
  b = good;
  const uint32_t fisher = static_cast<uint32_t>(StateKind::Fisher);
  std::memcpy(b.data() + 4, &fisher, 4);
  rejected(b, "kind and state disagree");
  // a keep state under another keep kind's header
  b = keep_partial(kKeepBootstrap, 0, 20, 1, 6);
  const uint32_t focal = static_cast<uint32_t>(StateKind::KeepFocal);
  std::memcpy(b.data() + 4, &focal, 4);
  rejected(b, "keep kinds disagree");
}

TEST(Partial, BodiesAreValidatedOnlyByCheckPartial) {
  // A kept datum that is not a unit vector: the header is fine, the body not.
  Bytes b = keep_partial(kKeepFocal, 0, 0, 0, 6);
  const size_t at = kPartialHeader + kKeepSerialHeader + 3 * sizeof(SlipDatum);
  const double two = 2.0;
  std::memcpy(b.data() + at, &two, 8);
  EXPECT_NO_THROW(read_partial_info(b.data(), b.size(), "fn"));
  EXPECT_EQ(error_of([&] { check_partial(b.data(), b.size(), "fn"); }).kind, ErrorKind::BadState);
  // misfits outside 0..180
  Bytes m = misfit_partial(20, {1, 2, 3}, 0);
  const double bad = 181;
  std::memcpy(m.data() + kPartialHeader + kMisfitSerialHeader + 8, &bad, 8);
  EXPECT_NO_THROW(read_partial_info(m.data(), m.size(), "fn"));
  EXPECT_EQ(error_of([&] { check_partial(m.data(), m.size(), "fn"); }).kind, ErrorKind::BadState);
}

TEST(Partial, TextRoundTripAndCanonicalText) {
  for (const Bytes &b : {stress_partial(11), fisher_partial(3, PartialInput::Lineation), density_partial(15, 20),
                         keep_partial(kKeepBootstrap, 0, 30, 7, 9), misfit_partial(45, {10, 50, 90, 0}, 1),
                         moment_partial(5, false)}) {
    const std::string t = text_of(b);
    EXPECT_EQ(from_text(t), b) << t.substr(0, 40);
    EXPECT_EQ(text_of(from_text(t)), t);
  }
  const std::string t = text_of(stress_partial(4));
  EXPECT_EQ(t.rfind("stress_inversion/fault_slip:", 0), 0u) << t;
  EXPECT_EQ(text_of(fisher_partial(3, PartialInput::Plane)).rfind("fisher_mean/plane:", 0), 0u);
}

TEST(Partial, TextRejections) {
  const std::string good = text_of(stress_partial(5));
  const std::string payload = good.substr(good.find(':') + 1);
  auto rejected = [](const std::string &s) {
    const Error e = error_of([&] { from_text(s); });
    EXPECT_EQ(e.kind, ErrorKind::InvalidText) << s.substr(0, 60);
    EXPECT_EQ(std::string(e.what()).rfind("invalid input syntax for type partial_state: \"", 0), 0u) << e.what();
    return e;
  };
  rejected("");
  rejected("stress_inversion/fault_slip");                 // no ':'
  rejected("stress_inversion:" + payload);                  // no input
  rejected("stress/fault_slip:" + payload);                 // unknown kind
  rejected("stress_inversion/fault-slip:" + payload);       // unknown input
  rejected("stress_inversion/plane:" + payload);            // no aggregate makes it
  rejected("stress_inversion/fault_slip:");                 // empty state
  rejected("stress_inversion/fault_slip:" + payload.substr(0, payload.size() - 1));  // length
  rejected("stress_inversion/fault_slip:" + payload.substr(0, payload.size() - 4));  // truncated state
  rejected("stress_inversion/fault_slip: " + payload.substr(1));  // a space
  rejected("fisher_mean/lineation:" + payload);  // the state is not a Fisher state
  std::string corrupt = payload;
  corrupt[10] = corrupt[10] == 'A' ? 'B' : 'A';  // the count changes: the sums no longer fit it
  const Error e = rejected("stress_inversion/fault_slip:" + corrupt);
  EXPECT_NE(e.detail.find("invalid stress inversion state"), std::string::npos) << e.detail;
  // a long input is quoted in part only
  const Error l = rejected("stress_inversion/fault_slip:" + std::string(5000, '!'));
  EXPECT_LT(std::string(l.what()).size(), 120u);
}

TEST(Partial, BinaryAcceptsWhatTextAccepts) {
  const Bytes good = density_partial(10, 30);
  EXPECT_NO_THROW(check_partial_binary(good.data(), good.size()));
  Bytes bad = good;
  bad.pop_back();
  const Error e = error_of([&] { check_partial_binary(bad.data(), bad.size()); });
  EXPECT_EQ(e.kind, ErrorKind::InvalidBinary);
  EXPECT_STREQ(e.what(), "invalid binary data for type partial_state");
  EXPECT_NE(e.detail.find("partial_state_recv"), std::string::npos) << e.detail;
}

// ---- merge rules --------------------------------------------------------------------------

TEST(Partial, MergeRules) {
  auto info = [](const Bytes &b) { return check_partial(b.data(), b.size(), "t"); };
  auto mixed = [](const PartialInfo &a, const PartialInfo &b) {
    const Error e = error_of([&] { merge_partial_info(a, b, "stress_inversion(partial_state)"); });
    EXPECT_EQ(e.kind, ErrorKind::InvalidParameter);
    EXPECT_EQ(std::string(e.what()).rfind("stress_inversion(partial_state): ", 0), 0u) << e.what();
    return std::string(e.what());
  };
  const PartialInfo s = merge_partial_info(info(stress_partial(5)), info(stress_partial(7)), "f");
  EXPECT_EQ(s.count, 12);
  EXPECT_NE(mixed(info(stress_partial(5)), info(keep_partial(kKeepBootstrap, 0, 10, 1, 5))).find("different kinds"),
            std::string::npos);
  EXPECT_NE(mixed(info(fisher_partial(3, PartialInput::Plane)), info(fisher_partial(3, PartialInput::Lineation)))
                .find("different kinds"),
            std::string::npos);
  EXPECT_NE(mixed(info(density_partial(10, 5)), info(density_partial(5, 5))).find("spacings"), std::string::npos);
  EXPECT_NE(mixed(info(keep_partial(kKeepFocal, 0.6, 0, 0, 5)), info(keep_partial(kKeepFocal, 0, 0, 0, 5)))
                .find("friction"),
            std::string::npos);
  EXPECT_NE(mixed(info(keep_partial(kKeepBootstrap, 0, 10, 1, 5)), info(keep_partial(kKeepBootstrap, 0, 10, 2, 5)))
                .find("seeds"),
            std::string::npos);
  EXPECT_NE(mixed(info(misfit_partial(20, {1}, 0)), info(misfit_partial(30, {1}, 0))).find("thresholds"),
            std::string::npos);
  EXPECT_NE(mixed(info(moment_partial(3, true)), info(moment_partial(3, false))).find("weighted"), std::string::npos);
  // a moment partial of no data has no weighting yet: it merges with either
  const PartialInfo w = merge_partial_info(info(moment_partial(0, false)), info(moment_partial(3, true)), "f");
  EXPECT_EQ(w.weighted, 1);
  EXPECT_NE(mixed(w, info(moment_partial(2, false))).find("weighted"), std::string::npos);
}
