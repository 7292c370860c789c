// Fixed-precision display (display.hpp).
#include "display.hpp"

#include <charconv>
#include <cstdio>
#include <cstdlib>

namespace striae {

void check_display_decimals(int decimals) {
  if (decimals < 0 || decimals > kMaxDisplayDecimals)
    throw Error(ErrorKind::InvalidParameter,
                "decimals must be from 0 to " + std::to_string(kMaxDisplayDecimals),
                "Got " + std::to_string(decimals) + ".");
}

namespace {

enum class Field { Azimuth, Dip, Rake, Plain };

// One number with `decimals` decimals; width pads the integer part with zeros.
std::string number(double v, int decimals, Field f) {
  char buf[64];
  const int width = f == Field::Azimuth ? 3 : f == Field::Dip ? 2 : 0;
  auto print = [&](double x) {
    std::snprintf(buf, sizeof buf, "%0*.*f", width + (decimals > 0 ? decimals + 1 : 0), decimals, x);
  };
  print(v);
  const double shown = std::strtod(buf, nullptr);
  if (shown == 0.0) print(0.0);                                // no "-0" or "-0.00"
  else if (f == Field::Azimuth && shown >= 360.0) print(0.0);  // 359.6 -> 000
  else if (f == Field::Rake && shown <= -180.0) print(180.0);  // rake -180 is 180
  return buf;
}

}  // namespace

std::string display(const Plane &p, int decimals) {
  check_display_decimals(decimals);
  return number(p.strike, decimals, Field::Azimuth) + "/" + number(p.dip, decimals, Field::Dip);
}

std::string display(const Line &l, int decimals) {
  check_display_decimals(decimals);
  return number(l.trend, decimals, Field::Azimuth) + "/" + number(l.plunge, decimals, Field::Dip);
}

std::string display(const FaultSlip &f, int decimals) {
  check_display_decimals(decimals);
  return number(f.strike, decimals, Field::Azimuth) + "/" + number(f.dip, decimals, Field::Dip) + "/" +
         number(f.rake, decimals, Field::Rake);
}

std::string display(const StressTensor &t, int decimals) {
  check_display_decimals(decimals);
  std::string s;
  for (int i = 1; i <= 3; ++i)
    s += (i > 1 ? ", sigma" : "sigma") + std::to_string(i) + " " + display(stress_axis(t, i), decimals);
  s += ", phi " + number(shape_ratio(t), decimals + 2, Field::Plain);
  if (t.data_count > 0) s += ", n " + std::to_string(t.data_count);
  if (t.flags & kStressHasMisfit) s += ", misfit " + number(t.mean_misfit, decimals, Field::Plain);
  return s;
}

std::string display_grid(const char *kind_name, double spacing, long long n, const double *values,
                         size_t count, int decimals) {
  check_display_decimals(decimals);
  char sp[32];
  auto r = std::to_chars(sp, sp + sizeof sp - 1, spacing);  // shortest round-trip form
  *r.ptr = '\0';
  std::string s = std::string("{\"kind\": \"") + kind_name + "\", \"spacing\": " + sp +
                  ", \"n\": " + std::to_string(n) + ", \"values\": [";
  s.reserve(s.size() + count * static_cast<size_t>(decimals + 4));
  for (size_t k = 0; k < count; ++k) {
    if ((k & 4095) == 4095) poll_interrupts();
    if (k) s += ", ";
    s += number(values[k], decimals, Field::Plain);
  }
  s += "]}";
  return s;
}

}  // namespace striae
