"""Common-practice rules and defaults: values no standard fixes, each with whose rule it is.

A job may override every one of them; the engine inputs (engine.model.inputs) and the job file
(fieldcomp.jobs.model) take their defaults from here. Units: inch, psf, ksi, days; deflection
limits are span / ratio.
"""

from __future__ import annotations

from engine.codes.asce37_14 import CONSTRUCTION_LOAD_PSF

# Camber decision (engine.construction.camber).
# Share of the predicted pre-composite dead-load deflection cambered out: common practice, as
# AISC Design Examples v16.0 Chapter I (80 %).
CAMBER_FRACTION = 0.80
# Camber rounded down to 1/4 in: common practice, as AISC Design Examples v16.0 Chapter I.
CAMBER_INCREMENT = 0.25  # in
# No camber under 3/4 in: common practice (from memory).
CAMBER_MINIMUM = 0.75  # in
# Beams under 24 ft long or under 14 in nominal depth are not cambered: common practice
# ("Specifying Camber", Modern Steel Construction, July 2006).
CAMBER_MIN_LENGTH = 24.0 * 12.0  # in
CAMBER_MIN_DEPTH = 14.0  # in
# Webs 1/4 in or thinner are not cambered (they may cripple in the cambering press): common practice (from memory).
CAMBER_MAX_THIN_WEB = 0.25  # in

# Finished beam (engine.finished.evaluate, engine.studs.placement).
# Least degree of composite sum Q_n / C_f: common practice, the lower limit of the I_equiv fit
# (AISC 360-22 Commentary I3.2a/I3.2d).
MIN_COMPOSITE = 0.25
# Live-load deflection within span/360 and superimposed dead + live within span/240: common
# practice (the usual floor limits, from memory).
LIVE_DEFLECTION_RATIO = 360.0
TOTAL_DEFLECTION_RATIO = 240.0

# Construction stage (engine.construction).
# Construction live load when the job states none: the ASCE/SEI 37-14 light class, as AISC
# Design Examples v16.0 Chapter I.
CONSTRUCTION_LIVE_PSF = CONSTRUCTION_LOAD_PSF["light"]
# Pre-composite dead-load deflection less camber within span/360 and 1 in: AISC Design Guide 3
# limit as used in AISC Design Examples v16.0 Chapter I.
WET_DEFLECTION_RATIO = 360.0
WET_DEFLECTION_MAX = 1.0  # in
# Concrete younger than this is taken as wet (no stiffness): assumption of this tool, no
# published source.
CURED_AFTER_DAYS = 1.0  # days

# Job-file defaults (fieldcomp.jobs.model).
# Steel yield stress when the job states none: common practice (ASTM A992 W shapes, 50 ksi).
FY_KSI = 50.0
# Stud tensile strength and diameter when the job states none: common practice (AWS D1.1
# Type B studs, F_u = 65 ksi, from memory; the usual 3/4 in stud).
STUD_FU_KSI = 65.0
STUD_DIAMETER = 0.75  # in

# Stud burn-off: the length a headed stud loses in drawn-arc welding (engine.studs.stud_lengths).
# Common practice, as a stud supplier publishes approximate reductions (Fraser Molloy, "Arc Stud
# Burn Off"): welded to bare steel 1/8 in for 1/2 in diameter and under, 3/16 in for 5/8 to 7/8 in,
# 1/4 in for 1 in and over; welded through metal deck 3/8 in (published for 3/4 in studs, used here
# for every diameter through deck). AWS D1.1 Clause 9 sets stud dimensions before welding, not the
# burn-off (from memory). Verify with the stud supplier for the deck and welding set-up.
STUD_BURN_OFF_BARE = ((0.5, 0.125), (0.875, 0.1875), (float("inf"), 0.25))  # (largest diameter, in)
STUD_BURN_OFF_THROUGH_DECK = 0.375  # in
