// Package curves holds the physical models of a parallel pump group: pump
// head and efficiency curves fitted from datasheet points and scaled by the
// affinity laws, motor and variable-speed drive part-load losses, the fluid,
// and the system (control) curve the pumps serve.
//
// # Units
//
// Everything inside is SI: flow in m³/s ([Flow]), head in metres of the
// pumped fluid ([Head]), power in watts ([Power]), density in kg/m³. The
// conversions to and from US and SI display units live in units.go and are
// used only at the edges (plant files, reports).
//
// # Affinity laws
//
// At speed ratio s = n/n₀ a pump whose rated-speed head curve is H₀(Q) gives
//
//	H(Q, s) = s² · H₀(Q/s)     η(Q, s) = η₀(Q/s)
//
// so that the point (sQ, s²H) at speed s corresponds to (Q, H) at rated
// speed, with shaft power scaled by s³ (every pump handbook). The optional
// Sârbu–Borza (1998) step-down corrects η for the loss of efficiency at
// reduced speed: η₂ = 1 − (1 − η₁)(n₁/n₂)^0.1.
//
// # Power chain
//
// Electrical input = shaft power + motor losses + drive losses. Motor
// part-load losses default to the US DOE pump test procedure's loss factor
// (10 CFR 431 subpart Y, appendix A); with a variable-speed drive the DOE
// combined motor-and-drive loss factor applies instead. Users can replace
// either with tables.
package curves
