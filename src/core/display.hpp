// Fixed-precision display of striae values for reports (SQL to_text). The type
// output functions print every value so that it reads back exactly; these
// round to a given number of decimals instead and are for people, not for
// storage.
//
// Conventions of the display (common practice, no source): azimuths (strike,
// trend) with three integer digits ('040'), dips and plunges with two ('05'),
// so that a column of orientations lines up and an azimuth is never mistaken
// for a dip; rakes signed and unpadded. An azimuth that rounds to 360 prints as
// 000, a rake that rounds to -180 as 180, and a value that rounds to zero never
// prints a minus sign.
#pragma once

#include "orientation.hpp"
#include "stress.hpp"

#include <string>

namespace striae {

constexpr int kMaxDisplayDecimals = 10;

// Throws InvalidParameter unless 0 <= decimals <= kMaxDisplayDecimals.
void check_display_decimals(int decimals);

std::string display(const Plane &p, int decimals);      // '110/64'
std::string display(const Line &l, int decimals);       // '020/26'
std::string display(const FaultSlip &f, int decimals);  // '110/64/-75'

// 'sigma1 040/00, sigma2 000/90, sigma3 130/00, phi 0.30' (phi with two more
// decimals than the angles), then ', n 12' for a tensor from data and
// ', misfit 4.5' when the mean misfit is defined.
std::string display(const StressTensor &t, int decimals);

// The sphere_grid text form with every value rounded to decimals (still a
// valid sphere_grid literal, and valid JSON).
std::string display_grid(const char *kind_name, double spacing, long long n, const double *values,
                         size_t count, int decimals);

}  // namespace striae
