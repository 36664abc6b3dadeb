"""The one door for the files a person writes: profiles and card styles.

`toml` alone imports tomllib and tomlkit; the keys of both kinds of file are declared once here, and each file is
read once per run.
"""
