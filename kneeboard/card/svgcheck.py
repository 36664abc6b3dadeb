"""Static checks of an SVG logo before any renderer sees it.

An SVG is a program for a renderer: it can name other files (`<image href="../../x.png">`), pull
in style sheets, declare entities that expand a thousandfold, and nest `<use>` copies or stack
filters until drawing takes hours. A logo may do none of that. The text is parsed with the
standard library's `xml.etree.ElementTree` only after DOCTYPE and ENTITY declarations are
refused; then every reference must stay inside the file (a `#fragment`, or an embedded PNG or
JPEG image as a `data:` URI), and its size and complexity are bounded. Only then is it drawn.
"""

import base64
import binascii
import re
import xml.etree.ElementTree as ET
from dataclasses import dataclass

from kneeboard.i18n import Msg, Num
from kneeboard.problems import Told

MAX_ELEMENTS = 5_000  #: elements in the file
MAX_DRAWN = 20_000  #: elements drawn once every `<use>` copy is counted
MAX_DEPTH = 50  #: element nesting
MAX_USES = 100  #: `<use>` elements
MAX_USE_CHAIN = 3  #: a `<use>` of something holding a `<use>` of ...: at most this many links
MAX_FILTERS = 20  #: `<filter>` elements, and elements drawn through a filter (copies counted)
MAX_FILTER_STEPS = 100  #: filter primitives (feGaussianBlur...) in all
MAX_CANVAS = 100_000.0  #: width, height and viewBox sizes [user units]
MAX_ASPECT = 20.0  #: a logo's long side is at most this many times its short side

_DATA_IMAGE = re.compile(r"data:image/(png|jpeg|jpg);base64,", re.IGNORECASE)
_URL = re.compile(r"url\(\s*(['\"]?)(.*?)\1\s*\)", re.IGNORECASE | re.DOTALL)
_LENGTH = re.compile(r"\s*([-+]?(?:[0-9]+(?:\.[0-9]*)?|\.[0-9]+)(?:[eE][-+]?[0-9]+)?)"
                     r"\s*(px|pt|pc|mm|cm|in|em|ex|%)?\s*\Z")
_UNIT_PX = {None: 1.0, "px": 1.0, "pt": 4 / 3, "pc": 16.0, "mm": 96 / 25.4, "cm": 96 / 2.54, "in": 96.0,
            "em": 16.0, "ex": 8.0}
_PROCESSING = re.compile(r"<\?\s*([A-Za-z_:][-\w.:]*)")
_FILTER_STYLE = re.compile(r"(?:^|;)\s*filter\s*:", re.IGNORECASE)


class SvgProblem(Told, ValueError):
    """An SVG logo refused; the message says what is wrong, without the file's name."""


@dataclass(frozen=True)
class SvgFacts:
    """What the checks learnt: the canvas the logo declares [user units] and the images it embeds."""

    width: float | None
    height: float | None
    embedded: tuple[bytes, ...]  #: decoded data: images, for the caller to check like a logo file


def check_svg(data: bytes) -> SvgFacts:
    """Check SVG bytes; raises SvgProblem naming the first thing refused."""
    text = _text(data)
    _refuse_declarations(text)
    root = _parse(text)
    if _local(root.tag) != "svg":
        raise SvgProblem(Msg("is not an SVG image (its outer element is <{tag}>)", tag=_local(root.tag)))
    elements = list(root.iter())  # iterative in C: no recursion however deep the file
    if len(elements) > MAX_ELEMENTS:
        raise SvgProblem(Msg("has {count} elements; a logo has at most {most}", count=str(len(elements)),
                             most=format(MAX_ELEMENTS, ",")))
    _check_depth(root)
    embedded = []
    ids = {}
    uses = steps = filters = 0
    for element in elements:
        tag = _local(element.tag)
        if tag in ("script", "foreignObject"):
            raise SvgProblem(Msg("holds a <{tag}> element; a logo is a drawing only", tag=tag))
        uses += tag == "use"
        filters += tag == "filter"
        steps += tag.startswith("fe")
        if tag == "style":
            _check_css(element.text or "", Msg("its <style> element"))
        for name, value in element.attrib.items():
            embedded.extend(_check_attribute(tag, _local(name), value))
        identifier = element.get("id")
        if identifier is not None:
            ids.setdefault(identifier, element)
    if uses > MAX_USES:
        raise SvgProblem(Msg("has {count} <use> elements; a logo has at most {most}", count=str(uses),
                             most=str(MAX_USES)))
    if filters > MAX_FILTERS or steps > MAX_FILTER_STEPS:
        raise SvgProblem(Msg("has {filters} filters of {steps} steps; a logo has at most {most} filters of "
                             "{most_steps} steps in all", filters=str(filters), steps=str(steps), most=str(MAX_FILTERS),
                             most_steps=str(MAX_FILTER_STEPS)))
    _Expansion(ids).check(root)
    width, height = _canvas(elements)
    return SvgFacts(width, height, tuple(embedded))


def _text(data: bytes) -> str:
    try:
        return data.decode("utf-8-sig")
    except UnicodeDecodeError as exc:
        raise SvgProblem(Msg("is not UTF-8 text (byte {byte}); save the SVG as UTF-8", byte=str(exc.start))) from None


def _refuse_declarations(text: str) -> None:
    upper = text.upper()
    if "<!DOCTYPE" in upper or "<!ENTITY" in upper:
        # entities expand exponentially ("billion laughs") or name other files: no logo needs them
        raise SvgProblem(Msg("declares a DOCTYPE or entities; a logo may not (remove the <!DOCTYPE ...> part)"))
    for name in _PROCESSING.findall(text):
        if name.lower() != "xml":  # <?xml-stylesheet href="..."?> would pull in another file
            raise SvgProblem(Msg("holds a <?{name} ...?> instruction; a logo may not", name=name))


def _parse(text: str) -> ET.Element:
    if not text.strip():
        raise SvgProblem(Msg("is empty"))
    try:
        return ET.fromstring(text)
    except ET.ParseError as exc:
        line, column = exc.position
        raise SvgProblem(Msg("is not well-formed XML (line {line}, column {column})", line=str(line),
                              column=str(column))) from None
    except (ValueError, RecursionError) as exc:
        raise SvgProblem(Msg("cannot be read as XML ({detail})", detail=str(exc)[:60])) from None


def _local(name) -> str:
    """The name without its namespace: "{http://www.w3.org/1999/xlink}href" -> "href"."""
    return name.rsplit("}", 1)[-1] if isinstance(name, str) else ""


def _check_depth(root: ET.Element) -> None:
    stack = [(root, 1)]
    while stack:
        element, depth = stack.pop()
        if depth > MAX_DEPTH:
            raise SvgProblem(Msg("nests elements more than {most} deep", most=str(MAX_DEPTH)))
        stack.extend((child, depth + 1) for child in element)


def _check_attribute(tag: str, name: str, value: str) -> list[bytes]:
    """Refuse references outside the file; return the images embedded by this attribute."""
    if name == "href":
        if value.startswith("#"):
            return []
        match = _DATA_IMAGE.match(value.strip())
        if match and tag == "image":
            return [_decode_embedded(value.strip()[match.end():])]
        shown = value if len(value) <= 40 else value[:37] + "..."
        raise SvgProblem(Msg("<{tag}> refers to {reference} outside the SVG; a logo may refer only to its own parts "
                             "(#name) or embed a PNG or JPEG image as a data: URI", tag=tag, reference=repr(shown)))
    if name == "style":
        _check_css(value, Msg("the style of a <{tag}>", tag=tag))
    elif "url(" in value.lower():
        _check_urls(value, f"<{tag} {name}>")
    return []


def _check_css(css: str, where: str) -> None:
    """`where` names the CSS in the message: a `Msg`, or the element and attribute as written."""
    lowered = css.lower()
    if "@import" in lowered:
        raise SvgProblem(Msg("{where} imports another style sheet; a logo may not", where=where))
    if "\\" in css:  # a CSS escape could spell a reference the checks below would not see
        raise SvgProblem(Msg("{where} holds a backslash escape; a logo's styles may not", where=where))
    _check_urls(css, where)


def _check_urls(value: str, where: str) -> None:
    opened = value.lower().count("url(")
    found = _URL.findall(value)
    if len(found) != opened:
        raise SvgProblem(Msg("{where} has a url( that cannot be read", where=where))
    for _quote, target in found:
        if not target.strip().startswith("#"):
            raise SvgProblem(Msg("{where} refers to {reference} outside the SVG; only url(#name) is allowed",
                                  where=where, reference=repr(target[:40])))


def _decode_embedded(payload: str) -> bytes:
    try:
        return base64.b64decode("".join(payload.split()), validate=True)
    except (binascii.Error, ValueError):
        raise SvgProblem(Msg("embeds an image whose data: URI is not valid base64")) from None


class _Expansion:
    """What drawing the tree costs once every `<use>` is replaced by a copy of what it refers to."""

    def __init__(self, ids: dict):
        self.ids = ids
        self.done: dict[str, tuple[int, int, int]] = {}  # id -> (elements drawn, use chain length, filters)

    def check(self, root: ET.Element) -> None:
        drawn, _chain, filtered = self.measure(root, ())
        if filtered > MAX_FILTERS:
            raise SvgProblem(Msg("draws {count} elements through filters; a logo draws at most {most}",
                                  count=str(filtered), most=str(MAX_FILTERS)))
        if drawn > MAX_DRAWN:  # measure stops early; this is the last word for a tree just under the bound
            raise SvgProblem(_too_many_drawn())

    def measure(self, element: ET.Element, chain: tuple[str, ...]) -> tuple[int, int, int]:
        drawn = longest = filtered = 0
        for node in element.iter():
            drawn += 1
            if node.get("filter") or _FILTER_STYLE.search(node.get("style", "")):
                filtered += 1
            if _local(node.tag) != "use":
                continue
            ref = self._target(node)
            if ref is None:
                continue  # refers to nothing: drawn as nothing
            if ref in chain:
                raise SvgProblem(Msg("a <use> of #{ref} refers back to itself; a logo's copies may not loop", ref=ref))
            if len(chain) + 1 > MAX_USE_CHAIN:
                raise SvgProblem(Msg("chains <use> copies more than {most} deep", most=str(MAX_USE_CHAIN)))
            if ref not in self.done:
                self.done[ref] = self.measure(self.ids[ref], chain + (ref,))
            sub_drawn, sub_chain, sub_filtered = self.done[ref]
            if len(chain) + 1 + sub_chain > MAX_USE_CHAIN:
                raise SvgProblem(Msg("chains <use> copies more than {most} deep", most=str(MAX_USE_CHAIN)))
            drawn += sub_drawn
            filtered += sub_filtered
            longest = max(longest, 1 + sub_chain)
            if drawn > MAX_DRAWN:
                raise SvgProblem(_too_many_drawn())
        return drawn, longest, filtered

    def _target(self, node: ET.Element) -> str | None:
        for name, value in node.attrib.items():
            if _local(name) == "href" and value.startswith("#") and value[1:] in self.ids:
                return value[1:]
        return None


def _too_many_drawn() -> Msg:
    return Msg("draws more than {most} elements once its <use> copies are counted", most=format(MAX_DRAWN, ","))


def _canvas(elements: list[ET.Element]) -> tuple[float | None, float | None]:
    """The outer canvas's size [user units]; every <svg> element's sizes are bounded."""
    outer = None
    for element in elements:
        if _local(element.tag) != "svg":
            continue
        width, height = _length(element.get("width"), "width"), _length(element.get("height"), "height")
        box = _view_box(element.get("viewBox"))
        if outer is None:
            w = width if width is not None else (box[0] if box else None)
            h = height if height is not None else (box[1] if box else None)
            outer = (w, h)
            for a, b in ((w, h), box or (None, None)):
                if a and b and max(a / b, b / a) > MAX_ASPECT:
                    raise SvgProblem(Msg("is {width} x {height} units: a logo's sides differ at most {most} times",
                                          width=Num(f"{a:g}"), height=Num(f"{b:g}"), most=Num(f"{MAX_ASPECT:g}")))
    return outer if outer is not None else (None, None)


def _length(value: str | None, name: str) -> float | None:
    if value is None:
        return None
    m = _LENGTH.match(value)
    if not m:
        raise SvgProblem(Msg("has a {name} that is not a length ({value})", name=name, value=repr(value[:30])))
    if m.group(2) == "%":
        return None  # relative to what it is drawn into: the viewBox says the size
    number = float(m.group(1)) * _UNIT_PX[m.group(2)]
    if not 0 < number <= MAX_CANVAS:
        raise SvgProblem(Msg("has a {name} of {value}; a logo's canvas is above 0 and at most {most} units", name=name,
                              value=value[:30], most=format(MAX_CANVAS, ",.0f")))
    return number


def _view_box(value: str | None) -> tuple[float, float] | None:
    if value is None:
        return None
    parts = value.replace(",", " ").split()
    try:
        numbers = [float(p) for p in parts]
    except ValueError:
        numbers = []
    if len(numbers) != 4:
        raise SvgProblem(Msg("has a viewBox that is not four numbers ({value})", value=repr(value[:40])))
    x, y, w, h = numbers
    if not (0 < w <= MAX_CANVAS and 0 < h <= MAX_CANVAS and abs(x) <= MAX_CANVAS and abs(y) <= MAX_CANVAS):
        raise SvgProblem(Msg("has a viewBox of {value}; a logo's canvas is above 0 and at most {most} units",
                             value=value[:40], most=format(MAX_CANVAS, ",.0f")))
    return w, h
