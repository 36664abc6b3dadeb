"""The words the profile editor (`app/editor.py`) and the style dialog (`app/style_dialog.py`) show, listed for the
catalogues: those modules lay their widgets out with English text, and the app translates it where it is shown
(`words.translate_tree`, when the window shows the editor or the dialog). When they mark their own words with
`tr`, the entries here go.

The editor's field labels, placeholders and help come from the declarations (`kneeboard.inputs.profile_keys`), which
`packaging/catalogues.py` reads into the catalogue itself; the block names come from the block registry.
"""

from kneeboard.i18n import N_

EDITOR = (
    N_("Aircraft"), N_("Weight for this card"), N_("Weight"), N_("The weight the speeds were published at"),
    N_("A total weight"), N_("Empty weight plus items"), N_("Configurations"), N_("Add"), N_("Duplicate"),
    N_("Remove"), N_("Move left"), N_("Move right"), N_("A factor of the stall speed"), N_("A fixed speed"),
    N_("Glider polar"), N_("This aircraft has a speed polar (gliders)"), N_("Card"), N_("Problems"),
    N_("No input problems found."), N_("(default)"), N_("degrees, e.g. 0, 15, 30, 45, 60"),
)

STYLE_DIALOG = (
    N_("Card style"), N_("Organization"), N_("Logo"), N_("Accent colour"), N_("Type size"), N_("Card size"),
    N_("Orientation"), N_("Binding edge"), N_("Blocks, in order (drag to reorder; the caution is always printed):"),
    N_("This profile's card"), N_("a PNG or SVG file in the fleet folder, e.g. logo.png"),
    N_("Half letter (5.5 x 8.5 in)"),
    N_("portrait"), N_("landscape"), N_("none"), N_("left"), N_("top"),
)
