#pragma once
// Absolute-tolerance check for the geomechanics suites (doctest's Approx is relative and loose).
#include <doctest/doctest.h>

#include <cmath>

#define CHECK_NEAR(actual, expected, tol)                                                        \
  do {                                                                                           \
    const double check_near_a_ = (actual), check_near_e_ = (expected), check_near_t_ = (tol);   \
    CHECK_MESSAGE(std::fabs(check_near_a_ - check_near_e_) <= check_near_t_,                     \
                  #actual " = " << check_near_a_ << ", expected " << check_near_e_ << " +- "     \
                                << check_near_t_);                                               \
  } while (0)
