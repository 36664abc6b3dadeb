"""Words the card, the app and the command line all show, kept in one place."""

CAUTION_CARD = (
    "Computed from published stall speeds for coordinated, level, power-off flight at the stated weight. "
    "Actual stall speed changes with centre of gravity, power, contamination and manoeuvre. "
    "The aircraft flight manual and local regulations govern. Not a substitute for instruction."
)

CAUTION_SHORT = (
    "Figures for coordinated, level flight at the stated weight. The flight manual and local regulations govern; "
    "no substitute for instruction."
)

CAUTION = (
    "CAUTION: figures are computed from published stall speeds for coordinated, level turns at the stated "
    "weight. The aircraft flight manual and local regulations govern; these figures are no substitute for "
    "instruction by a qualified flight instructor."
)

#: The formulas behind every figure, and where each comes from (the README's table), for the app's help.
FORMULAS_HTML = """\
<h3>Where each figure comes from</h3>
<p>Physics works in calibrated airspeed (CAS); the card prints indicated airspeed (IAS). Without a calibration
table IAS is taken equal to CAS.</p>
<table border="1" cellspacing="0" cellpadding="4">
<tr><th align="left">figure</th><th align="left">formula</th><th align="left">source</th></tr>
<tr><td>load factor in a level, coordinated turn</td><td>n = 1 / cos(bank)</td>
<td>FAA-H-8083-25 (Pilot's Handbook of Aeronautical Knowledge), load factor chart</td></tr>
<tr><td>stall speed in a bank</td><td>Vs(bank) = Vs &radic;n</td>
<td>FAA-H-8083-25, &ldquo;Load Factors and Stalling Speeds&rdquo;</td></tr>
<tr><td>stall speed and VA at weight</td><td>&times; &radic;(W / Wref)</td><td>lift equation; FAA-H-8083-25</td></tr>
<tr><td>pattern speed</td><td>factor &times; wings-level stall speed at the card weight (1.4 default, 1.3 least)</td>
<td>FAA-H-8083-3 (Airplane Flying Handbook), ch. 9</td></tr>
<tr><td>margin</td><td>pattern speed &minus; stall speed in the bank, IAS</td><td>definition</td></tr>
<tr><td>zero-margin bank</td><td>arccos((Vs / Vp)&sup2;), in CAS</td><td>from the two lines above</td></tr>
<tr><td>buffer bank</td><td>bank where the IAS margin equals the buffer</td><td>same</td></tr>
<tr><td>limit load factor, limit bank</td>
<td>3.8 / 4.4 / 6.0 (normal / utility / acrobatic), gliders 5.3; bank = arccos(1 / n)</td>
<td>14 CFR 23.337 before amendment 23-64; EASA CS 22.337</td></tr>
<tr><td>IAS &harr; CAS</td><td>linear in the manual's calibration table; outside it the end offset is held and
the figure flagged</td><td>the aircraft's flight manual</td></tr>
<tr><td>TAS</td><td>CAS &radic;(&rho;0 / &rho;)</td><td>incompressible relation, FAA-H-8083-25</td></tr>
<tr><td>density, density altitude</td><td>ICAO standard atmosphere, troposphere; &rho; = p / (R T) with the actual
temperature</td><td>ICAO Doc 7488, U.S. Standard Atmosphere 1976</td></tr>
<tr><td>turn radius and rate</td><td>R = V&sup2; / (g tan bank), rate = g tan bank / V, V true airspeed</td>
<td>FAA-H-8083-15 (Instrument Flying Handbook)</td></tr>
<tr><td>glider polar</td><td>least-squares quadratic; ballast &times; &radic;(W / Wpolar) on speed and sink; in a
turn speed &times; &radic;n, sink &times; n<sup>1.5</sup></td>
<td>common method; Welch, Welch &amp; Irving, <i>The Complete Soaring Pilot's Handbook</i></td></tr>
</table>
<p>Glider sink rates are true (a variometer reads true sink); polar speeds are read in the file's speed basis.</p>
<p><b>Rounding on the card is always toward safety:</b> stall speeds, pattern speeds, turn radii, times, sink rates
and heights round up; margins, banks, VA and flap limits round down, to 1 kt / 1 mph / 1 km/h and 1 degree.
Rounding happens once, in the table builder.</p>
"""
