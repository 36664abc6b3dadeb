"""What the preview calls the pages it shows: a card's faces, a card set's cards and faces, or sheets."""


def page_labels(count: int, mode: str = "card") -> list[str]:
    """Names of the pages in the page selector: a card's two sides; a card set's cards and faces; sheets."""
    if mode != "card":
        return [f"Sheet {i + 1} of {count}" for i in range(count)]
    sides = ("front", "back")
    if count <= 2:
        return ["Front", "Back"][:count]
    return [f"Card {i // 2 + 1} of {(count + 1) // 2} · {sides[i % 2]} (face {i + 1} of {count})" for i in range(count)]
