#pragma once
// Upper bound on the seismic moment of an induced earthquake from the net injected volume,
// and the moment magnitude scale.
//
// Sources:
//   McGarr, A. (2014), "Maximum magnitude earthquakes induced by fluid injection",
//     JGR Solid Earth 119, 1008-1019:  M0_max = G ΔV.
//   IASPEI (2013), "Summary of magnitude working group recommendations on standard procedures
//     for determining earthquake magnitudes from digital data":  Mw = (2/3)(log10 M0 - 9.1),
//     M0 in N·m (equivalent to Hanks & Kanamori 1979 with the constant 9.1).
//
// Symbol table (code -> paper):
//   shear_modulus   G     modulus of rigidity, Pa
//   net_volume      ΔV    net injected fluid volume (injected minus produced), m³
//   moment          M0    scalar seismic moment, N·m
//   mw              Mw    moment magnitude
namespace slipscreen::seismo {

// McGarr (2014) M0_max = G ΔV. Valid: G > 0, ΔV >= 0 (InputError otherwise).
// Accuracy: exact arithmetic; as a physical bound it is the paper's upper limit for a fully
// relieved, "all of the volume goes into seismic slip" case; runaway ruptures driven by tectonic
// stress can exceed it (Galis et al. 2017, Sci. Adv.).
double mcgarr_max_moment(double shear_modulus, double net_volume);

// IASPEI (2013) Mw = (2/3)(log10 M0 - 9.1). Valid: M0 > 0 N·m. Exact arithmetic.
double moment_magnitude(double moment);

// Inverse of the above: M0 = 10^(1.5 Mw + 9.1) N·m.
double seismic_moment(double mw);

}  // namespace slipscreen::seismo
