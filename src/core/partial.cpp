// partial_state values: header, validation, merge rules and text form
// (partial.hpp).
#include "partial.hpp"

#include "bootstrap.hpp"
#include "density.hpp"

#include <algorithm>
#include <charconv>
#include <cstring>
#include <vector>

namespace striae {

namespace {

template <class T>
T load(const unsigned char *p) {
  T v;
  std::memcpy(&v, p, sizeof v);
  return v;
}

template <class T>
void store(unsigned char *p, const T &v) {
  std::memcpy(p, &v, sizeof v);
}

// The byte layout is little-endian (partial.hpp); the raw states are copied
// as the machine holds them, so a big-endian build must not exchange them.
constexpr bool kLittleEndian = __BYTE_ORDER__ == __ORDER_LITTLE_ENDIAN__;

std::string num(double v) {
  char buf[32];
  const auto r = std::to_chars(buf, buf + sizeof buf, v);
  return std::string(buf, r.ptr);
}

[[noreturn]] void bad_partial(const char *fn, const std::string &what) {
  throw Error(ErrorKind::BadState, std::string(fn) + ": " + what);
}

struct KindName {
  StateKind kind;
  const char *name;
};
// The kinds a partial carries, by the aggregate that makes them.
constexpr KindName kKindNames[] = {
    {StateKind::Fisher, "fisher_mean"},
    {StateKind::Tensor, "orientation_tensor"},
    {StateKind::Density, "density_grid"},
    {StateKind::StressLinear, "stress_inversion"},
    {StateKind::RightDihedra, "right_dihedra"},
    {StateKind::KeepBootstrap, "stress_inversion_bootstrap"},
    {StateKind::KeepFocal, "focal_stress_inversion"},
    {StateKind::KeepFocalBootstrap, "focal_stress_inversion_bootstrap"},
    {StateKind::Phases, "stress_phases"},
    {StateKind::MisfitSummary, "misfit_summary"},
    {StateKind::MomentSum, "moment_tensor_sum"},
};

bool kind_from_u32(uint32_t v, StateKind &out) {
  for (const KindName &k : kKindNames)
    if (static_cast<uint32_t>(k.kind) == v) {
      out = k.kind;
      return true;
    }
  return false;
}

// Validates data of fixed-size items in place, a chunk at a time, without a
// copy of the whole body (a kept-data partial can hold 48 MB).
template <class T, class Check>
void check_items(const unsigned char *p, int64_t count, Check check) {
  constexpr int64_t kChunk = 1024;
  T buf[kChunk];
  for (int64_t i = 0; i < count; i += kChunk) {
    const int64_t n = std::min(kChunk, count - i);
    std::memcpy(buf, p + sizeof(T) * static_cast<size_t>(i), sizeof(T) * static_cast<size_t>(n));
    check(buf, n);
    poll_interrupts();
  }
}

// The header and the description; body says whether to validate the bodies
// of variable-length states too.
PartialInfo read_info(const unsigned char *p, size_t len, const char *fn, bool body) {
  if (!kLittleEndian)
    throw Error(ErrorKind::InvalidParameter, "partial_state values are not supported on big-endian machines");
  if (len < kPartialHeader + 4) bad_partial(fn, "not a partial_state value (too short)");
  const StateTag tag = load<StateTag>(p);
  const uint32_t input = load<uint32_t>(p + 8);
  if (tag.magic != kStateTagMagic) bad_partial(fn, "not a partial_state value (no state tag)");
  PartialInfo info{};
  if (!kind_from_u32(tag.kind, info.kind)) bad_partial(fn, "partial_state of an unknown kind");
  if (input < 1 || input > 3) bad_partial(fn, "partial_state of an unknown input type");
  info.input = static_cast<PartialInput>(input);
  if (!partial_pair_valid(info.kind, info.input))
    bad_partial(fn, "a " + std::string(partial_kind_name(info.kind)) + " partial cannot be made from " +
                        partial_input_name(info.input) + " rows");
  if (load<uint32_t>(p + 12) != 0) bad_partial(fn, "partial_state header: reserved field is not zero");
  const unsigned char *s = p + kPartialHeader;
  const size_t n = len - kPartialHeader;
  switch (info.kind) {
    case StateKind::Fisher: {
      FisherState st;
      read_fisher_state(s, n, st, fn);
      info.count = st.tensor.n;
      break;
    }
    case StateKind::Tensor: {
      TensorState st;
      read_tensor_state(s, n, st, fn);
      info.count = st.n;
      break;
    }
    case StateKind::Density: {
      // Always read whole: the count is the sum of the bins, and a list holds
      // at most density_bin_count() entries (2 MB).
      const DensitySerial h = read_density_header(s, n, fn);
      std::vector<uint32_t> ids(static_cast<size_t>(h.m));
      std::vector<uint64_t> counts(static_cast<size_t>(h.m));
      read_density_bins(s, n, h, ids.data(), counts.data(), fn);
      info.spacing = h.spacing;
      info.count = static_cast<int64_t>(bins_total(counts.data(), counts.size()));
      break;
    }
    case StateKind::StressLinear: {
      StressAccum st;
      read_stress_state(s, n, st, fn);
      info.count = st.count;
      break;
    }
    case StateKind::RightDihedra: {
      const DihedraHeader h = read_dihedra_header(s, n, fn);
      if (body) {
        std::vector<int64_t> counts(static_cast<size_t>(h.node_count));
        read_dihedra_counts(s, n, h, counts.data(), fn);
      }
      info.spacing = h.spacing;
      info.count = h.data_count;
      break;
    }
    case StateKind::KeepBootstrap:
    case StateKind::KeepFocal:
    case StateKind::KeepFocalBootstrap: {
      const KeepParams h = read_keep_header(s, n, fn);
      if (keep_state_kind(h.kind) != info.kind)
        bad_partial(fn, "the partial_state header and its stress inversion state disagree on the kind");
      if (body) check_items<SlipDatum>(s + kKeepSerialHeader, h.count, check_keep_data);
      info.count = h.count;
      info.resamples = h.resamples;
      info.seed = h.seed;
      info.friction = h.friction;
      break;
    }
    case StateKind::Phases: {
      const PhaseParams h = read_phase_header(s, n, fn);
      if (body) check_items<SlipDatum>(s + kPhaseSerialHeader, h.count, check_phase_data);
      info.count = h.count;
      info.phases = h.phases;
      info.starts = h.starts;
      info.seed = h.seed;
      break;
    }
    case StateKind::MisfitSummary: {
      const MisfitParams h = read_misfit_header(s, n, fn);
      if (body) check_items<double>(s + kMisfitSerialHeader, h.count, check_misfit_values);
      info.count = h.count + h.undefined;
      info.threshold = h.threshold;
      break;
    }
    case StateKind::MomentSum: {
      MomentAccum st;
      read_moment_state(s, n, st, fn);
      info.count = st.count;
      info.weighted = st.weighted;
      break;
    }
    default:
      bad_partial(fn, "partial_state of an unknown kind");
  }
  return info;
}

// The first characters of a text input, for messages (a partial's text can
// be megabytes long).
// At most 40 bytes of the literal, cut at a character boundary (core.hpp, echo_text).
std::string excerpt(const char *s) { return echo_text(s, 40); }

[[noreturn]] void bad_text(const char *s, const std::string &detail) {
  throw Error(ErrorKind::InvalidText, "invalid input syntax for type partial_state: \"" + excerpt(s) + "\"", detail,
              "A partial_state is written <kind>/<input>:<base64>, as partial_state_out prints it "
              "(made by the *_partial aggregates).");
}

int b64_value(unsigned char c) {
  if (c >= 'A' && c <= 'Z') return c - 'A';
  if (c >= 'a' && c <= 'z') return c - 'a' + 26;
  if (c >= '0' && c <= '9') return c - '0' + 52;
  if (c == '+') return 62;
  if (c == '/') return 63;
  return -1;
}

constexpr char kB64[] = "ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789+/";

}  // namespace

// ---- kinds ------------------------------------------------------------------------

bool partial_kind_supported(StateKind k) {
  StateKind found;
  return kind_from_u32(static_cast<uint32_t>(k), found);
}

bool partial_pair_valid(StateKind k, PartialInput in) {
  if (!partial_kind_supported(k)) return false;
  switch (k) {
    case StateKind::Fisher:
    case StateKind::Tensor:
    case StateKind::Density: return in == PartialInput::Lineation || in == PartialInput::Plane;
    default: return in == PartialInput::FaultSlip;
  }
}

const char *partial_kind_name(StateKind k) {
  for (const KindName &n : kKindNames)
    if (n.kind == k) return n.name;
  return "unknown";
}

const char *partial_input_name(PartialInput in) {
  switch (in) {
    case PartialInput::Lineation: return "lineation";
    case PartialInput::Plane: return "plane";
    case PartialInput::FaultSlip: return "fault_slip";
  }
  return "unknown";
}

std::string partial_label(StateKind k, PartialInput in) {
  return std::string(partial_kind_name(k)) + "/" + partial_input_name(in);
}

void write_partial_header(StateKind k, PartialInput in, unsigned char *out) {
  if (!partial_pair_valid(k, in))
    throw Error(ErrorKind::BadState, "no partial aggregate makes a " + partial_label(k, in) + " partial");
  store(out, state_tag(k));
  store(out + 8, static_cast<uint32_t>(in));
  store(out + 12, uint32_t(0));
}

// ---- validation and merging ----------------------------------------------------------

PartialInfo read_partial_info(const unsigned char *p, size_t len, const char *fn) {
  return read_info(p, len, fn, false);
}

PartialInfo check_partial(const unsigned char *p, size_t len, const char *fn) {
  return read_info(p, len, fn, true);
}

PartialInfo merge_partial_info(const PartialInfo &a, const PartialInfo &b, const char *fn) {
  const std::string f(fn);
  auto bad = [&](const std::string &what, const std::string &detail) {
    throw Error(ErrorKind::InvalidParameter, f + ": " + what, detail,
                "Merge only the partials of one aggregate called with the same parameters.");
  };
  if (a.kind != b.kind || a.input != b.input)
    bad("partials of different kinds in one group",
        "A " + partial_label(a.kind, a.input) + " partial and a " + partial_label(b.kind, b.input) +
            " partial cannot be merged.");
  if (a.spacing != b.spacing)
    bad("partials with different grid spacings in one group",
        "Spacing " + num(a.spacing) + " and " + num(b.spacing) + " degrees.");
  if (a.friction != b.friction)
    bad("partials with different friction in one group",
        "Friction " + (a.friction == 0 ? std::string("searched") : num(a.friction)) + " and " +
            (b.friction == 0 ? std::string("searched") : num(b.friction)) + ".");
  if (a.resamples != b.resamples || a.seed != b.seed || a.phases != b.phases || a.starts != b.starts)
    bad("partials with different resamples, seeds, phases or starts in one group",
        "The parameters of the partial aggregates must be the same for every partial of a group.");
  if (a.threshold != b.threshold)
    bad("partials with different misfit thresholds in one group",
        "Threshold " + num(a.threshold) + " and " + num(b.threshold) + " degrees.");
  if (a.weighted >= 0 && b.weighted >= 0 && a.weighted != b.weighted)
    bad("weighted and unweighted moment sums in one group",
        "moment_tensor_sum_partial(fault_slip) and moment_tensor_sum_partial(fault_slip, magnitude) do not mix.");
  PartialInfo m = a;
  if (m.weighted < 0) m.weighted = b.weighted;
  // Counts are each at most 2^53 (+10^7): the sum cannot overflow; the
  // combine functions enforce the aggregates' own limits.
  m.count = a.count + b.count;
  return m;
}

// ---- base64 ------------------------------------------------------------------------------

size_t base64_size(size_t len) { return (len + 2) / 3 * 4; }

void base64_encode(const unsigned char *p, size_t len, char *out) {
  size_t i = 0;
  for (; i + 3 <= len; i += 3) {
    const uint32_t v = (uint32_t(p[i]) << 16) | (uint32_t(p[i + 1]) << 8) | p[i + 2];
    *out++ = kB64[v >> 18];
    *out++ = kB64[(v >> 12) & 63];
    *out++ = kB64[(v >> 6) & 63];
    *out++ = kB64[v & 63];
  }
  if (len - i == 1) {
    const uint32_t v = uint32_t(p[i]) << 16;
    *out++ = kB64[v >> 18];
    *out++ = kB64[(v >> 12) & 63];
    *out++ = '=';
    *out++ = '=';
  } else if (len - i == 2) {
    const uint32_t v = (uint32_t(p[i]) << 16) | (uint32_t(p[i + 1]) << 8);
    *out++ = kB64[v >> 18];
    *out++ = kB64[(v >> 12) & 63];
    *out++ = kB64[(v >> 6) & 63];
    *out++ = '=';
  }
}

bool base64_decode(const char *s, size_t n, unsigned char *out, size_t &out_len) {
  out_len = 0;
  if (n % 4 != 0) return false;
  for (size_t i = 0; i < n; i += 4) {
    const bool last = i + 4 == n;
    int v[4];
    int pad = 0;
    for (int j = 0; j < 4; ++j) {
      const unsigned char c = static_cast<unsigned char>(s[i + j]);
      if (c == '=' && last && j >= 2) {
        v[j] = 0;
        ++pad;
        continue;
      }
      if (pad > 0) return false;  // a character after '='
      v[j] = b64_value(c);
      if (v[j] < 0) return false;
    }
    const uint32_t w = (uint32_t(v[0]) << 18) | (uint32_t(v[1]) << 12) | (uint32_t(v[2]) << 6) | uint32_t(v[3]);
    // Unused bits must be zero, so that every value has one text.
    if ((pad == 1 && (w & 0xff) != 0) || (pad == 2 && (w & 0xffff) != 0)) return false;
    out[out_len++] = static_cast<unsigned char>(w >> 16);
    if (pad < 2) out[out_len++] = static_cast<unsigned char>(w >> 8);
    if (pad < 1) out[out_len++] = static_cast<unsigned char>(w);
    if ((i & 0xfffff) == 0xffffc) poll_interrupts();
  }
  return true;
}

// ---- text form ---------------------------------------------------------------------------

size_t partial_text_size(const unsigned char *p, size_t len) {
  const StateTag tag = load<StateTag>(p);
  StateKind k;
  if (!kind_from_u32(tag.kind, k)) throw Error(ErrorKind::BadState, "partial_state of an unknown kind");
  const PartialInput in = static_cast<PartialInput>(load<uint32_t>(p + 8));
  return partial_label(k, in).size() + 1 + base64_size(len - kPartialHeader);
}

void write_partial_text(const unsigned char *p, size_t len, char *out) {
  StateKind k;
  if (len < kPartialHeader || !kind_from_u32(load<StateTag>(p).kind, k))
    throw Error(ErrorKind::BadState, "partial_state of an unknown kind");
  const std::string label = partial_label(k, static_cast<PartialInput>(load<uint32_t>(p + 8)));
  std::memcpy(out, label.data(), label.size());
  out += label.size();
  *out++ = ':';
  base64_encode(p + kPartialHeader, len - kPartialHeader, out);
  out[base64_size(len - kPartialHeader)] = '\0';
}

PartialText scan_partial_text(const char *s) {
  const char *colon = std::strchr(s, ':');
  if (colon == nullptr) bad_text(s, "No ':' between the kind and the state.");
  const std::string label(s, static_cast<size_t>(colon - s));
  const size_t slash = label.find('/');
  if (slash == std::string::npos) bad_text(s, "The kind is written <aggregate>/<input type>, e.g. fisher_mean/plane.");
  const std::string kind = label.substr(0, slash), input = label.substr(slash + 1);
  PartialText t{};
  bool kind_ok = false;
  for (const KindName &k : kKindNames)
    if (kind == k.name) {
      t.kind = k.kind;
      kind_ok = true;
    }
  if (!kind_ok) {
    std::string names;
    for (const KindName &k : kKindNames) names += std::string(names.empty() ? "" : ", ") + k.name;
    bad_text(s, "Unknown kind \"" + echo_text(kind, 40) + "\"; the kinds are " + names + ".");
  }
  if (input == "lineation") t.input = PartialInput::Lineation;
  else if (input == "plane") t.input = PartialInput::Plane;
  else if (input == "fault_slip") t.input = PartialInput::FaultSlip;
  else bad_text(s, "Unknown input type \"" + echo_text(input, 40) + "\"; lineation, plane or fault_slip.");
  if (!partial_pair_valid(t.kind, t.input))
    bad_text(s, "No partial aggregate makes a " + label + " partial.");
  t.b64 = colon + 1;
  t.b64_len = std::strlen(t.b64);
  if (t.b64_len == 0 || t.b64_len % 4 != 0)
    bad_text(s, "The state is base64 (RFC 4648) with padding: its length must be a positive multiple of 4.");
  size_t pad = 0;
  if (t.b64[t.b64_len - 1] == '=') ++pad;
  if (t.b64_len >= 2 && t.b64[t.b64_len - 2] == '=') ++pad;
  t.size = kPartialHeader + t.b64_len / 4 * 3 - pad;
  return t;
}

PartialInfo decode_partial_text(const char *s, const PartialText &t, unsigned char *out) {
  write_partial_header(t.kind, t.input, out);
  size_t n = 0;
  if (!base64_decode(t.b64, t.b64_len, out + kPartialHeader, n) || kPartialHeader + n != t.size)
    bad_text(s, "The state is not valid base64 (RFC 4648: A-Z a-z 0-9 + /, '=' padding only at the end, "
                "unused bits zero, no spaces or line breaks).");
  try {
    return check_partial(out, t.size, "partial_state_in");
  } catch (const Error &e) {
    bad_text(s, std::string(e.what()) + (e.detail.empty() ? "" : "; " + e.detail));
  }
}

PartialInfo check_partial_binary(const unsigned char *p, size_t len) {
  try {
    return check_partial(p, len, "partial_state_recv");
  } catch (const Error &e) {
    throw Error(ErrorKind::InvalidBinary, "invalid binary data for type partial_state",
                std::string(e.what()) + (e.detail.empty() ? "" : "; " + e.detail));
  }
}

}  // namespace striae
