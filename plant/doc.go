// Package plant reads plant files: one YAML file describing one group of
// parallel centrifugal pumps, the system they serve, its load, its tariff,
// a drive retrofit and the staging sequence the plant runs today.
//
// [Load] and [Parse] check the whole file and return a [Plant] in SI
// units, or an [ErrorList] naming every problem at once, each with its
// file, line, column and field path:
//
//	plant.yaml:8:16: pumps[0].min_speed: minimum speed 110 % is above the maximum speed 100 %
//	plant.yaml:18:21: pumps[0].motor.rated_output: 10 hp is less than the pump's shaft power at the design head (27.43 hp at 1011 gpm and 90 ft, rated speed), even with service factor 1.15
//	plant.yaml:19:7: pumps[0].motor.servise_factor: unknown key "servise_factor" (did you mean "service_factor"?)
//
// The reference of the format — every section and field with its unit,
// default, range and the source of the default — is docs/plant-file.md
// in the repository; a test keeps it in step with this loader.
//
// # A plant file
//
//	name: North Campus chilled water     # optional; defaults to the file name
//	description: three equal pumps        # optional free text
//	units: US                            # US or SI: how every number below is read
//
//	fluid:                               # optional; default water at 20 °C (68 °F)
//	  temperature: 44                    # °F (US) or °C (SI); density by Kell (1975)
//	  # specific_gravity: 1.04           # glycol or brine: density = SG × 999.972 kg/m³
//
//	pumps:                               # one entry per pump model
//	  - name: CHWP-1..3
//	    count: 3                         # identical installed units (default 1)
//	    tags: [CHWP-1, CHWP-2, CHWP-3]   # optional: one tag per installed unit
//	    standby: 0                       # optional: units held in standby, never planned
//	    drive_bypass: false              # optional: a bypass contactor lets a unit run across the line
//	    rated_speed: 1780                # rpm; also gives the motor's pole count
//	    curve:                           # datasheet points at rated speed, rising flow
//	      - {flow: 0,    head: 118}
//	      - {flow: 400,  head: 112, efficiency: 60}
//	      - {flow: 1000, head: 91,  efficiency: 84}
//	      - {flow: 1400, head: 67,  shaft_power: 30.8}
//	    head_fit: quadratic              # or cubic (4 points or more); default quadratic
//	    allow_rising: false              # accept a head curve that rises with flow
//	    speed_correction: true           # Sârbu–Borza step-down below rated speed (default on)
//	    min_speed: 30%                   # fraction (0.3) or percentage; default 30 %
//	    max_speed: 100%                  # may exceed 100 %; default 100 %
//	    min_flow: 300                    # flow, or % of BEP flow (30%); default 30 % of BEP
//	    runout: 1400                     # flow, or % of BEP flow; default the last point
//	    motor:
//	      rated_output: 30               # hp (US) or kW (SI)
//	      full_load_efficiency: 93.6     # %; default NEMA Premium (10 CFR 431.25 Table 5)
//	      service_factor: 1.15           # default 1.15
//	      part_load:                     # optional; default the US DOE loss factor
//	        - {load: 25%, efficiency: 88.0}
//	        - {load: 50%, efficiency: 92.5}
//	        - {load: 100%, efficiency: 93.6}
//	    drive:                           # "variable" (DOE default losses), "fixed", or:
//	      type: variable
//	      efficiency_table:              # drive efficiency vs load; or iec_losses (8 points)
//	        - {load: 25%, efficiency: 90}
//	        - {load: 100%, efficiency: 96}
//	    branch_loss: {head: 3, flow: 1000}   # optional: head lost in the unit's own piping
//	    npshr:                           # optional: NPSH required (NPSH3) at rated speed, for the
//	      - {flow: 400,  npshr: 9}       # NPSH check: flow and NPSHr (ft or m), rising flow,
//	      - {flow: 1000, npshr: 14}      # at least two points
//	      - {flow: 1400, npshr: 21}
//
//	system:
//	  design_flow: 3000                  # plant flow at design
//	  design_head: 90                    # head at the pumps at design flow
//	  dp_control:                        # closed loop held at a remote DP sensor, or …
//	    control_head: 15 psi             # the setpoint at the sensor
//	    sensor: far air handler          # optional: where the DP sensor is (for the sequence)
//	    reset:                           # optional linear setpoint reset
//	      low_flow: 40%                  # at and below this flow (or % of design flow) …
//	      low_head: 8 psi                # … the control head is this,
//	      high_flow: 80%                 # rising to control_head at and above this flow
//	  # fixed_curve:                     # … an open or fixed system: static + k Q²
//	  #   static_head: 12
//	  plant_min_flow: 600                # optional: chiller/boiler minimum held by a bypass
//	  bypass_at: plant                   # optional: plant (default) or loop_end
//
//	suction:                             # optional: the suction side, for the NPSH check
//	  static_head: 6                     # level of the tank (or of the point where the pressure
//	                                     # is given) above the impeller eye; negative: a lift
//	  loss: {head: 2, flow: 3000}        # friction from there to the suction at a plant flow
//	                                     # (default the design flow), scaling with flow²; default 0
//	  altitude: 650                      # ft (US) or m (SI): an open tank at the standard
//	                                     # atmosphere's pressure there (ISO 2533); default sea level
//	  # absolute_pressure: 30 psi        # or a closed system: the absolute pressure at that level,
//	  # gauge_pressure: 12 psi           # or gauge, above the atmosphere at altitude (psi or kPa)
//	  margin: 1.3                        # NPSHa/NPSHr asked for at every point; default 1.3
//
//	profile:                             # bins, or a trend
//	  bins:
//	    - {flow: 25%, hours: 900}        # flow or % of design flow; hours a year
//	    - {flow: 1650, hours: 1700}
//	  # trend:
//	  #   file: chilled-water-trend.csv  # relative to the plant file
//	  #   time_column: timestamp         # default the first column
//	  #   time_format: "YYYY-MM-DD hh:mm"   # or "MM/DD/YYYY h:mm AM", a Go layout, unix, unix_ms or excel; default: tried
//	  #   time_zone: America/Chicago     # IANA zone of stamps without offset (not Local); default UTC
//	  #   interval: 60                   # minutes (or "15 min", "1 h"); default the median step
//	  #   flow_column: plant_flow_gpm    # default the one header containing "flow"
//	  #   flow_unit: gpm                 # gpm, m3/h or L/s; default read from the header
//	  #   max_flow: 6000                 # rows above are dropped; default 3 × 99th percentile
//	  #   dp_column: loop_dp_psi         # optional
//	  #   dp_unit: psi                   # psi, kPa, ft or m; default read from the header
//	  #   power_column: pump_kw          # optional, measured total pump kW
//	  # annual_hours: 8760               # hours a year the profile stands for; default:
//	  #                                  # the bins' own hours (the plant off the rest),
//	  #                                  # or 8760 for a trend (scaled by 8760 ÷ covered h)
//
//	tariff:
//	  currency: USD
//	  energy_price: 0.092                # per kWh: flat, or outside every period
//	  periods:                           # optional time-of-use periods, hours [start, end)
//	    - {name: on-peak, price: 0.168, start_hour: 12, end_hour: 18, days: weekdays}
//	  demand_charge: 13.75               # optional, per kW of each month's peak
//	  emissions_factor: 0.39             # optional, kg CO2e per kWh
//
//	retrofit:                            # optional
//	  drive_cost: 7800                   # installed cost per drive
//	  other_cost: 6500                   # default 0
//	  life_years: 15                     # default 15
//	  discount_rate: 5%                  # real, per year; default 0 %
//	  escalation: 2.5%                   # energy price, per year; default 0 %
//
//	sequence:                            # optional: the sequence the plant runs today,
//	  stage_up_speed: 95%                # either speed thresholds: add a unit above this speed …
//	  stage_down_speed: 45%              # … drop one below this
//	  stage_up_delay: 5                  # minutes (or "90 s"); default 0
//	  stage_down_delay: 10
//	  # or units by plant flow (a plant at fixed speed today, or staging on flow):
//	  # running: 2                       # a fixed number always running, or
//	  # bands:                           # units running below each flow, the last open
//	  #   - {up_to: 1500, running: 1}
//	  #   - {running: 2}
//	  # fixed_speed: true                # across the line today; default true with running/bands
//
// Keys are fixed: a key the format does not know is an error, with the
// nearest known key suggested. A key given with no value is an error too;
// leave the key out to take its default.
//
// # Units
//
// With units: US every flow is in gpm, every head in ft, every power (motor
// rating, shaft power) in hp and every temperature in °F; with units: SI,
// flows are in m³/h, heads in m, powers in kW and temperatures in °C. A
// bare number is read in those units. A suffix may say so explicitly or
// pick the other unit the trade uses in that system:
//
//	US   flow "1000 gpm"            head "90 ft" or "15 psi"     power "30 hp"
//	SI   flow "250 m³/h" or "70 L/s" head "26 m" or "150 kPa"    power "55 kW"
//
// A head written as a pressure is converted with the fluid's density:
// h = p / (ρ g), so 15 psi is 34.6 ft of water at 44 °F and less of a
// denser glycol. A unit of the other system ("25 L/s" in a US file) is an
// error. Tariff prices are per kWh and per kW in either system.
//
// Efficiencies and losses are written in percent (84 or "84%"); a value of
// 1 % or less is refused as a fraction typed where a percentage belongs.
// Speeds, loads and rates are fractions (0.95) or percentages with a sign
// ("95%"); a bare number too large to be a fraction (95) is refused.
// Flows for min_flow and runout may be "% of BEP flow" ("30%"); flows in
// bins, reset and plant_min_flow may be "% of design flow".
//
// # Curve points
//
// Give at least three points (four for a cubic head fit) in order of rising
// flow, each with a head and, where the flow is above zero, an efficiency
// or a shaft power (at water of 998.2 kg/m³, the datasheet convention).
// The fits and their residuals are in [curves.Pump]. The efficiency is
// fitted through zero at zero flow, so the points must show the datasheet's
// efficiency curve with its rise from low flow to the best efficiency point
// and past it; a fit that misses a given point by more than
// [curves.EffMissTolerance] (10 points of efficiency) is refused with that
// point named — one constant efficiency at every point is the usual cause.
//
// # Plant minimum flow and its bypass
//
// Below plant_min_flow the pumps move the minimum flow and a bypass carries
// the difference. Where that bypass sits sets the head the pumps work
// against. bypass_at: plant (the default) is a bypass in the plant, across
// the pumps' header: the loop beyond it carries only the load flow, and the
// pumps make the head the system needs at the load flow. bypass_at:
// loop_end is a bypass at the far end of the loop (a three-way valve at the
// last coil, say): the whole pumped flow crosses the loop, and the pumps
// make the head the system needs at the pumped flow. The default is listed
// among the plant's defaults when a minimum flow is given.
//
// # NPSH
//
// With pumps[].npshr and a suction section, every operating point is checked
// for cavitation margin. NPSH available at the pump suction is
//
//	NPSHa = (p_abs − p_v) / (ρ g) + static_head − loss × (Q / loss.flow)²
//
// with p_abs the standard atmosphere at the altitude (open tank; ICAO/ISO
// barometric formula), or the closed system's pressure (absolute, or gauge
// plus that atmosphere), p_v the vapour pressure of water at
// fluid.temperature (IAPWS-IF97 equation 30; for a glycol or brine, water's,
// which is higher than the mixture's: cautious), and Q the plant's pumped
// flow through the suction. NPSH required is read off the npshr points,
// linearly between them, and scaled by the affinity laws to the unit's
// speed: s² · NPSHr₀(Q/s). A point falls short where NPSHa < margin ×
// NPSHr; the default margin 1.3 lies inside the ratios of about 1.1 to 1.5 or
// more that the Hydraulic Institute's guideline ANSI/HI 9.6.1 recommends by
// application and suction energy (from memory): give the one for the pump.
//
// # Drives
//
// drive: fixed is a motor started across the line: no drive losses, no
// speed change. drive: variable is a variable-speed drive with the US DOE
// default combined motor-and-drive part-load loss by motor size. A mapping
// gives the drive's own data instead: an efficiency_table of load (the
// motor's input over its rated input) against drive efficiency, or the
// eight loss points of IEC 61800-9-2 as relative speed and torque in % and
// the loss in % of rated power:
//
//	drive:
//	  type: variable
//	  iec_losses:
//	    - {speed: 0,  torque: 25,  loss: 0.9}
//	    - {speed: 0,  torque: 50,  loss: 1.1}
//	    - {speed: 0,  torque: 100, loss: 1.6}
//	    - {speed: 50, torque: 25,  loss: 1.0}
//	    - {speed: 50, torque: 50,  loss: 1.3}
//	    - {speed: 50, torque: 100, loss: 2.0}
//	    - {speed: 90, torque: 50,  loss: 1.6}
//	    - {speed: 90, torque: 100, loss: 2.6}
//
// # What is checked
//
// Besides keys, types and ranges, the loader checks the physics it can:
// efficiencies above 100 %, negative flows, a minimum speed above the
// maximum, fewer than three points, duplicate or unsorted flows, a head
// curve rising with flow, a best efficiency point outside the points, a
// minimum flow at or above BEP, a design head above the highest head
// (shutoff, or a hump's peak) of every pump at its maximum speed, a motor
// smaller (even with its service factor) than the pump's shaft power at
// the design head, a control head or static head above the design head,
// reset flows out of order,
// overlapping tariff periods, bins adding up to more than a year, and unit
// mistakes that show: a pump that would need ten times its motor at its
// own BEP, or a design flow ten times what every unit can deliver. A file
// larger than [MaxFileSize], an empty file and a binary file are refused
// before the YAML parser sees them, with the line and column of the first
// byte that is not text.
//
// # Ranges and limits
//
// Every number has a range; a value outside it is an error naming the
// field. Money, flows, heads and powers are bounded far above any real
// plant so that no accepted value can make a total overflow or print as
// NaN or infinity; the plausibility checks above catch unit mistakes well
// inside the bounds.
//
//	field                                   accepted
//	pumps                                   1 to 12 models
//	pumps[].count                           1 to 20 installed units
//	all models together                     at most 16,000 count vectors, Π(count + 1) − 1 over
//	                                        the models (the optimiser's work grows with them);
//	                                        2,500 where fixed- and variable-speed models mix
//	pumps[].rated_speed                     100 to 10000 rpm
//	pumps[].curve                           3 (4 for cubic) to 100 points, rising flow, falling head,
//	                                        not all at the same head
//	pumps[].curve[].efficiency              above 1 % and below 100 % (100 % has no losses:
//	                                        no real pump, and the loss models divide by them)
//	pumps[].min_speed, max_speed            above 0, max_speed at most 150 %
//	pumps[].npshr                           2 to 100 points, rising flow, NPSHr above zero
//	pumps[].motor.full_load_efficiency      50 % to below 100 %
//	pumps[].motor.service_factor            1.0 to 1.5
//	pumps[].motor.part_load, drive tables   2 to 100 rows; efficiencies as above
//	any flow                                0 to 1000 m³/s (15.85 million gpm); % forms up to 10000 %
//	any head (or pressure as head)          0 to 10000 m (32808 ft)
//	any power (motor rating, shaft power)   above 0 to 1 GW (1.34 million hp)
//	fluid.temperature                       water 0–150 °C (Kell 1975); with specific_gravity −60–150 °C
//	fluid.specific_gravity                  0.5 to 2
//	suction.altitude                        −500 to 5000 m (−1640 to 16404 ft)
//	suction.absolute_pressure               above 0 to 10 MPa (1450 psi); gauge_pressure down
//	                                        to a perfect vacuum
//	suction.margin                          1 to 5 (NPSHa/NPSHr)
//	profile.bins                            1 to 10000 bins, hours above 0, at most 8784 h in all
//	profile.annual_hours                    above 0, at most 8784 h
//	profile.trend.interval                  above 0, at most a day
//	profile.trend.time_zone                 an IANA zone name or UTC; not Local
//	tariff.energy_price, periods[].price    0 to 100000 per kWh
//	tariff.demand_charge                    0 to 10000000 per kW
//	tariff.emissions_factor                 0 to 2 kg CO2e per kWh
//	tariff.periods                          at most 48; hours 0–24
//	retrofit.drive_cost, other_cost         0 to 10¹² in the currency
//	retrofit.life_years                     1 to 50
//	retrofit.discount_rate                  0 to 50 % a year
//	retrofit.escalation                     −50 to 50 % a year
//	sequence stage speeds                   0 to 150 %
//	name                                    one line, at most 200 characters
//	pumps[].name, tariff.periods[].name     one line, at most 60 characters
//	tariff.currency                         one line, at most 8 characters (USD, EUR, €)
//	description                             at most 2000 characters
//
// Whole numbers are decimal: a zero-padded 0600 (octal in YAML) or a 0x,
// 0o or 0b number is refused, as is a number with a comma ("600,5",
// "1,200"). Control characters other than tab and line breaks are refused
// where they stand raw in the file (YAML does not allow them); written as
// escapes in a double-quoted name they are accepted and printed escaped.
// A Unicode line separator (U+0085, U+2028, U+2029) is refused with its
// line and column, since YAML would count it as a line break.
//
// # The file itself
//
// The plant file and its trend log must be regular files: a named pipe, a
// device or a folder is refused before it is opened, so a read cannot wait
// forever. A plant file is at most [MaxFileSize] bytes; UTF-8 (with or
// without a byte-order mark) or UTF-16 with a byte-order mark.
//
// # Defaults and warnings
//
// Every value the loader fills in is listed in Plant.Defaults in plain
// words with its source (e.g. the motor efficiency from the NEMA Premium
// table), so reports can flag it. Plant.Warnings lists what is usable but
// questionable, such as a motor running into its service factor at the
// design head, a unit that cannot reach the design head, a shutoff shaft
// power more than 5 % from the fitted one (the efficiency fit passes
// through zero at zero flow and cannot use it), or a fitted best
// efficiency point more than 10 % in flow from the datasheet point of
// highest efficiency; each [Warning]
// points at the value it is about (file, line, column and field path), as
// an [Error] does.
//
// The defaults (minimum speed 30 %, minimum flow 30 % of BEP, service
// factor 1.15) are common practice, not the equipment's limits: minimum
// flow and speed, cavitation (NPSH), motor cooling at low speed and the
// chiller or boiler minimum flow must be confirmed with the manufacturers
// before a sequence is changed.
package plant
