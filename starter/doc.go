// Package starter writes a commented starting plant file: a small, invented
// plant of two equal pumps on variable-speed drives that passes `wattstage
// check` and `wattstage plan` as written, with a comment on every field
// saying what it means, its unit and its default, for the user to replace
// with their own plant's values.
//
// # Choices
//
// [Units] picks US (gpm, ft, hp, °F) or SI (m³/h, m, kW, °C); [System] picks
// a closed loop held at a remote differential-pressure sensor ([DP]) or a
// fixed system curve of static head plus friction ([Fixed]). The four files
// differ only in those sections and in the numbers; every field is
// documented in full in docs/plant-file.md.
//
// The numbers are invented for the starting file and are not a check of
// anything: a datasheet curve of a common end-suction pump shape, a motor
// with margin over the pump's largest shaft power, a flat tariff.
package starter
