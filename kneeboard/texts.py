"""Words the card, the app and the command line all show, kept in one place."""

CAUTION_CARD = (
    "Computed from published stall speeds for coordinated, level, power-off flight at the stated weight. "
    "Actual stall speed changes with centre of gravity, power, contamination and manoeuvre. "
    "The aircraft flight manual and local regulations govern. Not a substitute for instruction."
)

CAUTION = (
    "CAUTION: figures are computed from published stall speeds for coordinated, level turns at the stated "
    "weight. The aircraft flight manual and local regulations govern; these figures are no substitute for "
    "instruction by a qualified flight instructor."
)
