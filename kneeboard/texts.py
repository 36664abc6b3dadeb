"""Words the card, the app and the command line all show, kept in one place.

Each caution is marked for the catalogues (`N_`) and shown in the card's language where it is printed
(`translator(language)(CAUTION_CARD)`); as a `str` it is the English text.
"""

from kneeboard.i18n import ENGLISH, N_, translator

CAUTION_CARD = N_(
    "Computed from the flight manual's power-off stall speeds, for coordinated, level turns at the stated weight. "
    "The actual stall speed changes with center of gravity, power, contamination and maneuver. "
    "The aircraft flight manual and local regulations govern. Not a substitute for instruction."
)

CAUTION_SHORT = N_(
    "Figures for coordinated, level flight at the stated weight. The flight manual and local regulations govern; "
    "no substitute for instruction."
)

CAUTION = N_(
    "CAUTION: figures are computed from published stall speeds for coordinated, level turns at the stated "
    "weight. The aircraft flight manual and local regulations govern; these figures are no substitute for "
    "instruction by a qualified flight instructor."
)

#: Under the turn-back figures, on the card and in the text table
CAUTION_TURN_BACK = N_(
    "Coordinated gliding turn, still air, after the reaction time, without roll-in and roll-out. Wind, the runway's "
    "position and the pilot's practice govern; a turn back is a decision for the flight manual, operator and training."
)

#: The formulas behind every figure, and where each comes from (the README's table), for the app's help: each
#: piece marked for the catalogues; the sources' titles and the regulations' numbers stay as they are written.
FORMULAS_TITLE = N_('Where each figure comes from')
FORMULAS_INTRO = N_(
    '<b>Every stall happens at one angle of attack</b>, whatever the bank or the weight, and the airspeed '
    "indicator's position error follows the angle of attack. So the indicated stall speed rises with the "
    "bank and the weight exactly as the calibrated one does (flight manuals' stall-speed-by-bank tables "
    "list IAS and CAS each rising by &radic;n). The flight manual's calibration table is a 1-g table: it "
    'converts the published stall speed to the basis the file does not give (the best-glide speed '
    'likewise, both then scaled with the weight at one angle of attack), and the speeds flown at 1 g '
    '(pattern speed, VA, VFE). Without a table IAS is taken equal to CAS.'
)
FORMULAS_HEADS = (N_('figure'), N_('formula'), N_('source'))
FORMULAS_ROWS = (
    (
        N_('load factor in a level, coordinated turn'),
        N_('n = 1 / cos(bank)'),
        N_("FAA-H-8083-25 (Pilot's Handbook of Aeronautical Knowledge), load factor chart"),
    ),
    (
        N_('stall speed in a bank and at a weight'),
        N_('Vs(bank) = Vs &radic;n, and &times; &radic;(W / Wref) at another weight, in IAS and in CAS alike'),
        N_('FAA-H-8083-25, &ldquo;Load Factors and Stalling Speeds&rdquo;; lift equation'),
    ),
    (
        N_('pattern speed'),
        N_(
            'a fixed speed, or factor &times; the CAS stall speed at the card weight (1.4 default; less than 1.3 '
            'in CAS is warned), converted to IAS'
        ),
        N_('FAA-H-8083-3 (Airplane Flying Handbook), ch. 9'),
    ),
    (
        N_('margin'),
        N_('printed pattern speed &minus; printed stall speed in the bank (IAS): the printed figures add up'),
        N_('definition'),
    ),
    (
        N_('zero-margin bank'),
        N_('arccos((Vs / Vp)&sup2;), IAS, at the printed pattern speed'),
        N_('from the two lines above'),
    ),
    (
        N_('buffer bank'),
        N_('arccos((Vs / (Vp &minus; buffer))&sup2;), IAS'),
        N_('same'),
    ),
    (
        N_('limit load factor'),
        N_('3.8 (less above 4,118 lb) / 4.4 / 6.0 (normal / utility / acrobatic), gliders 5.3'),
        N_('14 CFR 23.337 before amendment 23-64; EASA CS 22.337'),
    ),
    (
        N_('limit with flaps or air brakes'),
        N_(
            'aeroplanes +2.0 with the flaps extended; gliders +4.0 with the wing-flaps in a landing setting, +3.5 '
            "with the air brakes extended; never above the aircraft's own limit; or the flight manual's own "
            'figure for the configuration. A configuration with a flap limit speed has its flaps extended unless '
            'the file says otherwise'
        ),
        N_('14 CFR 23.345(a)(1) before amendment 23-64; CS 22.345(b)(1)(i), CS 22.345(a)(1)'),
    ),
    (
        N_('limit above the maximum weight'),
        N_('n<sub>limit</sub> &times; W<sub>max</sub> / W'),
        N_('the design limit load, n<sub>limit</sub> W<sub>max</sub>, reached sooner'),
    ),
    (
        N_('limit bank'),
        N_("arccos(1 / n<sub>limit</sub>): where a level turn reaches the structure's limit load"),
        N_('from the load factor'),
    ),
    (
        N_('VA at this weight'),
        N_(
            'VA &times; &radic;(W / W<sub>VA</sub>) when lighter (W<sub>VA</sub> the weight VA is published at, '
            'by default the reference weight); never above the published VA'
        ),
        N_('FAA-H-8083-25; 14 CFR 23.1507, CS 22.1507'),
    ),
    (
        N_('available load factor (the pull at the pattern speed)'),
        N_(
            '(Vp / Vs)&sup2;, IAS, wings level: the load factor that stalls the wing at the pattern speed (1.96 g '
            "at 1.4 Vs); marked &ldquo;!&rdquo; where the configuration's limit load factor comes first. Stall "
            'speed at n g: Vs &times; &radic;n'
        ),
        N_('FAA-H-8083-25, &ldquo;Load Factors and Stalling Speeds&rdquo;'),
    ),
    (
        N_('turn back after an engine failure'),
        N_(
            'a coordinated gliding turn at the best-glide angle of attack: speed V<sub>bg</sub> &times; &radic;n '
            '(IAS), sink rate V / ((L/D) cos bank), height lost through a heading change &Delta;&psi;: &Delta;h = '
            'V<sub>bg</sub>&sup2; &Delta;&psi; / (g (L/D) sin bank cos bank), least at 45&deg;; V<sub>bg</sub> '
            'the true best-glide airspeed at 1 g at the card weight (best-glide speed &times; &radic;(W / Wref), '
            'through the calibration and the density). Before the turn, a straight glide for the reaction time: '
            'V<sub>bg</sub> t / (L/D). A best-glide sink rate given instead of the ratio: L/D = V<sub>bg</sub> / '
            'sink. Margin: the speed in the turn &minus; the stall speed at that bank of the configuration it '
            'glides in: the one the profile names, else the clean one (nothing extended; of several, the one that '
            "stalls fastest). Banks at or past that configuration's limit bank are marked. Still air, no roll-in "
            'or roll-out. Heading changes 180&deg; and 270&deg; by default (regaining the runway needs more than '
            '180&deg;; 270&deg;: common practice); reaction time 4 s by default (common practice)'
        ),
        N_(
            'derived from the lift equation; the published analyses of the turn back after take-off reach the '
            'same result, e.g. Rogers, &ldquo;The Possible &lsquo;Impossible&rsquo; Turn&rdquo;, Journal of '
            'Aircraft 32(2), 1995 (cited from memory); FAA-H-8083-3 (Airplane Flying Handbook), engine failure '
            'after take-off, for the decision itself'
        ),
    ),
    (
        N_('IAS &harr; CAS'),
        N_("linear in the manual's calibration table; outside it the end offset is held and a warning printed"),
        N_("the aircraft's flight manual"),
    ),
    (
        N_('TAS'),
        N_('from CAS through the impact pressure and the Mach number (compressible, subsonic)'),
        N_('ICAO Doc 7488; isentropic flow relations'),
    ),
    (
        N_('density, density altitude'),
        N_('ICAO standard atmosphere to 20 km; &rho; = p / (R T) with the actual temperature'),
        N_('ICAO Doc 7488, U.S. Standard Atmosphere 1976'),
    ),
    (
        N_('turn radius and rate'),
        N_('R = V&sup2; / (g tan bank), rate = g tan bank / V, V true airspeed'),
        N_(
            "FAA-H-8083-25 (Pilot's Handbook of Aeronautical Knowledge), &ldquo;Rate of Turn&rdquo; and "
            '&ldquo;Radius of Turn&rdquo; (its aviation-unit forms R[ft] = V[kt]&sup2; / (11.26 tan bank), rate = '
            '1091 tan bank / V[kt])'
        ),
    ),
    (
        N_('glider polar'),
        N_(
            'least-squares quadratic; ballast &times; &radic;(W / Wpolar) on speed and sink; in a turn speed '
            '&times; &radic;n, sink &times; n<sup>1.5</sup>'
        ),
        N_("common method; Welch, Welch &amp; Irving, <i>The Complete Soaring Pilot's Handbook</i>"),
    ),
)
FORMULAS_NOTES = (
    N_(
        'The flaps and air-brake limits (14 CFR 23.345, CS 22.345), the VA ceiling (14 CFR 23.1507, CS '
        "22.1507) and the normal category's 60&deg; (14 CFR 23.3) are cited from memory or secondary sources, "
        "not yet checked against the regulations' text: where the flight manual gives its own figure, enter "
        'it; the flight manual governs.'
    ),
    N_(
        "Glider sink rates are true (a variometer reads true sink); polar speeds are read in the file's speed "
        'basis.'
    ),
    N_(
        '<b>Rounding on the card is always toward safety:</b> stall speeds, pattern speeds, turn radii, '
        'times, sink rates and heights round up; margins, banks, VA, limit and available load factors, glide '
        'ratios and flap limits round down, to 1 kt / 1 mph / 1 km/h, 1 degree, 0.1 g (load factors in the '
        'margin table up, to 0.01) and, for the turn back, 10 ft or 5 m. Every warning is printed on the '
        'card, on every page. Rounding happens once, in the table builder.'
    ),
)


def formulas_html(tr) -> str:
    """The formulas page, as the app's Help shows it, in the language of `tr` (an `i18n.Translator`)."""
    heads = "".join(f'<th align="left">{tr(head)}</th>' for head in FORMULAS_HEADS)
    rows = "\n".join("<tr>" + "".join(f"<td>{tr(cell)}</td>" for cell in row) + "</tr>" for row in FORMULAS_ROWS)
    notes = "\n".join(f"<p>{tr(note)}</p>" for note in FORMULAS_NOTES)
    return (f"<h3>{tr(FORMULAS_TITLE)}</h3>\n<p>{tr(FORMULAS_INTRO)}</p>\n"
            f'<table border="1" cellspacing="0" cellpadding="4">\n<tr>{heads}</tr>\n{rows}\n</table>\n{notes}\n')


FORMULAS_HTML = formulas_html(translator(ENGLISH))  #: the page in English (the documentation test reads it)
