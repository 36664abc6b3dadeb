"""What the preview calls the pages it shows: a card's faces, a card set's cards and faces, or sheets."""


from kneeboard.app.words import tr


def page_labels(count: int, mode: str = "card") -> list[str]:
    """Names of the pages in the page selector: a card's two sides; a card set's cards and faces; sheets."""
    if mode != "card":
        return [tr("Sheet {n} of {count}", n=i + 1, count=count) for i in range(count)]
    if count <= 2:
        return [tr("Front"), tr("Back")][:count]
    sides = (tr("front"), tr("back"))
    return [tr("Card {card} of {cards} · {side} (face {n} of {count})", card=i // 2 + 1, cards=(count + 1) // 2,
               side=sides[i % 2], n=i + 1, count=count) for i in range(count)]
