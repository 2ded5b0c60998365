// Package econ prices the energy a pump group uses and appraises a drive
// retrofit.
//
// # Tariffs
//
// A [Tariff] has a flat energy price, optional time-of-use periods (hours of
// the day on weekdays, weekends or both), a demand charge on each calendar
// month's peak kW and an emissions factor. [Cost] prices a series of
// [Sample]s, each the mean electrical power over an interval. A
// time-stamped series (an hourly trend) is priced hour by hour and month by
// month; an untimed one (flow bins) cannot be placed in the day or the
// month, so time-of-use energy is spread by each period's share of the week
// and the demand charge is the highest bin power times 12 months. The
// [Bill] says so in its Warnings. Average prices overstate savings when
// most of the saving falls off-peak; that is why the split is kept.
//
// # Retrofit appraisal
//
// [Appraise] sets a strategy's bill against a baseline's: annual savings
// (energy cost and demand charge), investment (drives × drive cost + other
// costs), simple payback, net present value, savings-to-investment ratio
// and discounted payback, over the retrofit's life with its real discount
// rate d and energy price escalation e. Savings counted at today's tariff
// grow as (1+e)^k and are discounted as (1+d)^-k at the end of year k, so
// their present value is the annual savings times the modified uniform
// present value factor of NIST Handbook 135 ([UPVStar]):
//
//	UPV* = (1+e)/(d−e) · [1 − ((1+e)/(1+d))^N],   UPV* = N when d = e.
//
// A strategy that saves nothing never pays back: its payback is +Inf
// (written "never" by [PaybackText], null in JSON), its NPV is the negative
// investment or worse.
//
// These are planning estimates: tariffs change, and the savings rest on the
// plant model; confirm with the utility and a licensed engineer before
// committing money.
package econ
