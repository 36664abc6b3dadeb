"""The desktop app: edit profiles, see the card as it will print, print it."""
