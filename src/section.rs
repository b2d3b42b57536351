//! Properties of the hollow circular (annulus) shell section, m-based SI.
//!
//! Thin-walled tube formulas are exact for the annulus: A = pi/4 (D^2 - d^2),
//! I = pi/64 (D^4 - d^4), d = D - 2t (any structural mechanics text). Cowper's (1966) shear
//! coefficient for a hollow circular section,
//! k = 6(1+nu)(1+m^2)^2 / ((7+6nu)(1+m^2)^2 + (20+12nu)m^2), m = d/D
//! (G. R. Cowper, J. Appl. Mech. 33 (1966) 335-340, table 1).
