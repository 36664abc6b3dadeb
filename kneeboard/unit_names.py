"""The display units a card may use, as profiles and styles write them: plain names, without the units library.

`kneeboard.units` (which loads pint) parses and formats quantities with them; the style keys, the profile fields and
the command line's choices take them from here, so naming a unit never loads pint.
"""

SPEED_UNITS = ("kt", "mph", "km/h")
DISTANCE_UNITS = ("ft", "m")
WEIGHT_UNITS = ("kg", "lb")
