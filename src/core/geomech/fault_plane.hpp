#pragma once
// A fault plane's orientation: strike/dip (right-hand rule) or dip direction/dip, and its
// unit normal in North-East-Down axes.
//
// Sources:
//   right-hand rule: the plane dips to the right of the strike direction; dip direction =
//   strike + 90°                                       Allmendinger et al. (2012), Structural
//                                                      Geology Algorithms, ch. 2 (common practice)
//   n = (−sinδ sinφs, sinδ cosφs, −cosδ)  (upward normal, pointing into the hanging wall)
//   strike vector s = (cosφs, sinφs, 0); down-dip vector d = (−cosδ sinφs, cosδ cosφs, sinδ)
//
// Symbol table (code -> literature):
//   strike          φs   rad clockwise from north, [0, 2π)
//   dip             δ    rad below horizontal, [0, π/2]
//   dip_direction   φd   rad clockwise from north = φs + π/2
//   normal()        n    unit normal, NED, Down component ≤ 0
#include <Eigen/Dense>

namespace slipscreen::geomech {

class FaultPlane {
 public:
  // Throws InputError("dip", ...) unless 0 ≤ dip ≤ 90° (1e-12 rad of rounding is clamped),
  // and InputError("strike", ...) for a non-finite strike. The strike is wrapped to [0, 2π).
  static FaultPlane from_strike_dip(double strike, double dip);
  static FaultPlane from_dip_direction(double dip_direction, double dip);
  // The plane with normal ±n (either sign gives the same plane). InputError for a zero vector.
  static FaultPlane from_normal(const Eigen::Vector3d& n);

  double strike() const { return strike_; }
  double dip() const { return dip_; }
  double dip_direction() const;

  Eigen::Vector3d normal() const;          // upward unit normal (into the hanging wall)
  Eigen::Vector3d strike_vector() const;   // unit, horizontal, along strike
  Eigen::Vector3d dip_vector() const;      // unit, down the dip

 private:
  FaultPlane(double strike, double dip) : strike_(strike), dip_(dip) {}
  double strike_, dip_;
};

// An angle wrapped to [0, 2π).
double wrap_azimuth(double a);

}  // namespace slipscreen::geomech
