// Package optimize finds the lowest-power way to run a group of parallel
// centrifugal pumps at a load, runs the plant over a load profile under
// several strategies, and derives staging setpoints an automation system
// can run.
//
// Everything inside is SI: flow in m³/s, head in metres of the pumped
// fluid, power in watts. The plant (pump models, motors, drives, the
// system curve, the plant minimum flow) comes from package plant, the
// physical models from package curves.
//
// # What the solver solves
//
// For a load flow Q the pumps move the pumped flow
//
//	Q_p = max(Q, Q_min,plant)
//
// (the difference goes through the bypass) against a header head H that is
// at least the system's need H_sys(Q) on the control curve at the load flow
// (the bypass at the plant; with plant.Plant.BypassAtLoopEnd, at the pumped
// flow Q_p, the whole of it crossing the loop):
//
//	minimise  Σ_units P_in,i(q_i, H)
//	subject to  Σ_units q_i = Q_p,  H ≥ H_sys(Q),  each q_i in its allowed range at H
//
// H_sys(Q) is a floor, not an equality: where a speed or flow floor binds,
// running above the control curve (the valves absorbing the extra head) can
// cost less. P_in is the electrical input, shaft power through the motor
// and drive losses of package curves. [Solver.Solve] returns the best
// state as a [Result] with every unit's speed, flow, head, efficiencies and
// the limit it sits on; where no combination serves the flow the Result is
// [Unmet], with the shortfall and the reason.
//
// # Method
//
// Every vector of running counts per model (each model from none to all of
// its installed units, not all zero) is a candidate; [Constraint] narrows
// them to a total or to one vector.
//
// Bounds before evaluation. Their number, Π(count+1) − 1, grows
// exponentially with the models, so on a plant of more than 16 vectors
// they are not all evaluated: a branch and bound over the models lists
// them with a lower bound on their input (bound.go, branch.go) and they are
// evaluated from the lowest bound up until the next bound passes the best
// input found (with a 0.2 % allowance). At the required head h_r the bound
// is Lagrangian (weak duality): for any multiplier λ, Σ n_i P_i(q_i) ≥
// λQ + Σ n_i min over the span of (P_i(q) − λq), additive over models,
// taken over a ladder of λ and refined at a vector's own best λ before it
// is evaluated. A vector that needs a higher head is bounded over every
// speed and flow its units may take from h_r up (affinity laws, the least
// ratio of wire to shaft power of its motor and drive), and by the
// required-head bound less riseMargin (an observed, not proven, margin).
//
// Per-model spans. At a header head H each model's units may run over one
// interval of per-unit flow: from the larger of the flow at minimum speed
// and the minimum flow, to the smaller of the flow at maximum speed, the
// runout and the flow at which the shaft power reaches the motor's rating
// times its service factor. Minimum flow and runout are given at rated
// speed and move along affinity parabolas, q = X·s with X the
// rated-equivalent flow. A branch loss k·q² between a unit and the header
// is folded into an effective rated-speed curve H₀eff(X) = H₀(X) − k·X²
// (curves.Pump.NetCurve), so that the affinity law H = s²·H₀eff(q/s)
// inverts in closed form for quadratic curves and by safeguarded Newton on
// the falling branch for cubic ones of either sign; runout is capped at the
// end of that branch, where a cubic with a positive x³ term turns up again.
// A fixed-speed unit's span is the single flow its curve gives at H.
//
// Capacity. An unmet result states the largest flow the allowed
// combinations deliver at or above the required head with every limit met,
// max over combinations and heads H ≥ H_req of Σ n_i·q_i,max(H), and the
// limits that hold it (the required head, runout, maximum speed, the
// motor). It is not the flow at the required head: a unit held at runout
// gives more as the head rises, up to the head where its runout meets its
// top-speed curve.
//
// Equal marginal power. Fixed-speed units give their curve flow; the
// variable-speed models share the rest. For a separable convex cost with
// one coupling sum the optimum has equal marginal power dP_i/dq_i = λ
// wherever no bound binds (the Karush–Kuhn–Tucker conditions; the
// equal-incremental-cost rule of economic dispatch). It is found by
// projected Newton steps in the manner of Bertsekas (1982, SIAM J. Control
// and Optimization 20(2)): each step minimises a separable quadratic model
// of the power, with derivatives by central differences, subject to the
// flow sum and the bounds, exactly (the multiplier λ lies between two
// breakpoints of a piecewise-linear sum), then backtracks on the true
// power. Identical units of a model share equally. Where a model's power is
// not convex in its flow (an efficiency rising slowly from zero flow, the
// Sârbu–Borza floor, a drive table's kinks) the split between models can
// have two minima, the better one often with a unit at its minimum flow or
// runout: then, or where a bound of the split already beats the Newton
// split, the split is scanned from bound to bound and both ends and every
// local minimum are refined by golden section (acrossModels); the head
// search's many trial heads use the Newton split alone and the head it
// keeps gets this global one. To save time every
// combination is first costed with the variable flow split in proportion
// to the models' ranges (exact for one variable model); only those within
// 3 % of the best get the full allocation.
//
// Header head. A combination whose units move too much flow even at their
// floors at H_sys gets the lowest header head at which it fits: a scan over
// a per-solve head grid, refined by bisection, abandoned once ρ·g·Q·H/η_BEP
// (a lower bound on the combination's input) exceeds the best found. The
// combinations within 2 % of the best are then searched over H by a scan
// and golden section (Kiefer 1953); where every unit is inside its limits
// the envelope theorem says the slope in H is the slope at fixed flows, and
// the search is skipped when that slope is positive.
//
// Unequal splits. In the best state (not under a common speed), identical
// units share a model's flow equally unless their power curve is not convex on the span (a flat pump efficiency curve can
// leave a drive's light-load losses in charge); then j of the n units at a
// second flow are tried, by scan and golden section, and a split is kept
// only where it saves power.
//
// Humped curves. On a curve that rises from shutoff to a peak a unit runs
// only on the falling branch, at least 2 % right of the peak, where flow is
// a single-valued function of head (on the rising side two flows share a
// head and parallel units hunt; common practice). The peak acts as a
// further minimum flow. Its head, above the shutoff head, is the top of
// every head bound (the head grid, the lowest feasible head, the head
// search, the capacity behind an unmet result): a fixed-speed unit there
// serves flows on its falling branch at heads above shutoff.
//
// The method was chosen over a general constrained solver (gonum/optimize)
// because the structure — separable power, one coupling constraint, one
// scalar H — allows an exact method that is faster and does not stall at
// the equal split, which is always a stationary point. With
// [Options].CommonSpeed every running variable-speed unit gets one speed
// signal instead, found by bisection on the speed, as many automation
// systems run a plant.
//
// # Strategies
//
// A [Strategy] runs the plant over [Step]s, the bins of a load profile or
// the intervals of a time-stamped trend, and returns a [Run]:
//
//   - [Lowest]: the solver's lowest-power state at every step.
//   - [Staged]: one common speed for the running drive units, a unit added
//     above a stage-up speed and dropped below a stage-down speed after
//     their delays, as a plant's automation system runs today.
//   - [Sequenced]: a derived staging sequence ([Setpoints]) with its
//     deadbands and delays on flow or speed ([Basis]); [Sequenced.RunCycling]
//     also counts stage changes and motor starts per hour against the NEMA
//     MG 10 guidance ([StartsPerHour]), and [PriceSequence] compares its
//     energy with the optimum's and the current thresholds'.
//   - [Throttled]: every unit at fixed speed on its curve, a valve burning
//     the extra head, the fewest units that serve the flow.
//   - [ConstantBypass]: the design-flow state all year, the flow the load
//     does not take going through bypasses.
//
// # Staging setpoints
//
// [DeriveSetpoints] turns the lowest-power staging into values a building
// automation system can run. The stages are the combinations of running
// units that the common-speed optimum picks as the plant flow rises (one
// speed signal for every running unit on a drive, as sequences are
// programmed); a combination that is best again after another absorbs the
// excursion, since a sequence needs one order of stages. Between two stages
// A and B the stage-up flow is the crossover, the flow Q* where
//
//	P_A(Q*) = P_B(Q*)
//
// with P_X the lowest input of combination X at plant flow Q, found by
// Brent's root search on P_A − P_B (Brent 1973; Viholainen et al. 2013 and
// Bortoni et al. 2008 state the equal-power rule for identical units),
// unless A runs out of capacity first: then the stage-up flow sits a margin
// below the flow at which A reaches its limit, with a shorter delay. The
// stage-down flow lies a deadband below the stage-up flow, widened until
// the units running just after a stage-up turn at least a speed margin
// faster than their own stage-down speed (so that a stage-up never
// immediately calls for the stage-down), and raised where a unit's minimum
// flow or speed, the plant minimum flow or the band of the stage below
// would be broken. Each value is given in flow and speed terms with the
// limit that sets it; [Setpoints.WriteTable] and
// [Setpoints.SequenceOfOperation] write them as a table and as plain
// paragraphs.
//
// # Cautions
//
// The results are computed from the data given, not measured. Minimum flow
// and speed, cavitation (NPSH, which this package does not check), motor
// cooling at low speed, the chiller or boiler minimum flow and resonance at
// particular speeds must be confirmed with the pump, motor, drive and
// chiller or boiler manufacturers; the derived setpoints are starting
// values to be verified and adjusted on commissioning, under the local
// codes and the responsibility of a licensed engineer.
package optimize
