"""Can the app's window open here? Said in one line before Qt is asked, instead of Qt's abort.

On Linux the window needs a display (X11 or Wayland) and, on X11, the system libraries of Qt's xcb platform
plugin, which a minimal desktop install may lack. Each missing library is named by the Debian/Ubuntu package that
provides it, so the answer is one `apt install` line. Nothing here imports Qt.
"""

import os
import re
import socket
import sys
from pathlib import Path

from kneeboard.i18n import N_, Msg

#: The system libraries Qt 6's xcb platform plugin and the Qt libraries under it load (their ELF NEEDED entries,
#: less what the PySide6 wheel carries itself), and the Debian/Ubuntu package of each.
XCB_LIBRARIES = {
    "libxcb.so.1": "libxcb1",
    "libxcb-cursor.so.0": "libxcb-cursor0",
    "libxcb-icccm.so.4": "libxcb-icccm4",
    "libxcb-image.so.0": "libxcb-image0",
    "libxcb-keysyms.so.1": "libxcb-keysyms1",
    "libxcb-randr.so.0": "libxcb-randr0",
    "libxcb-render.so.0": "libxcb-render0",
    "libxcb-render-util.so.0": "libxcb-render-util0",
    "libxcb-shape.so.0": "libxcb-shape0",
    "libxcb-shm.so.0": "libxcb-shm0",
    "libxcb-sync.so.1": "libxcb-sync1",
    "libxcb-util.so.1": "libxcb-util1",
    "libxcb-xfixes.so.0": "libxcb-xfixes0",
    "libxcb-xkb.so.1": "libxcb-xkb1",
    "libX11.so.6": "libx11-6",
    "libX11-xcb.so.1": "libx11-xcb1",
    "libxkbcommon.so.0": "libxkbcommon0",
    "libxkbcommon-x11.so.0": "libxkbcommon-x11-0",
    "libEGL.so.1": "libegl1",
    "libGL.so.1": "libgl1",
    "libfontconfig.so.1": "libfontconfig1",
    "libfreetype.so.6": "libfreetype6",
    "libglib-2.0.so.0": "libglib2.0-0",
    "libdbus-1.so.3": "libdbus-1-3",
}
LIBRARY_FOLDERS = ("/usr/lib/x86_64-linux-gnu", "/usr/lib/aarch64-linux-gnu", "/lib/x86_64-linux-gnu",
                   "/lib/aarch64-linux-gnu", "/usr/lib64", "/usr/lib", "/lib64", "/lib", "/usr/local/lib")
HEADLESS = N_("the commands check, table, card and compare work without one (kneeboard --help)")


def library_folders() -> tuple[str, ...]:
    """Where the window's libraries may be: the system's folders and, in the standalone program (`make bundle`),
    its own folder, whose copies the program loads first, so a library it carries is never asked for."""
    bundle = getattr(sys, "_MEIPASS", None) if getattr(sys, "frozen", False) else None
    return (bundle, *LIBRARY_FOLDERS) if bundle else LIBRARY_FOLDERS


def missing_packages(folders=None) -> list[str]:
    """Debian/Ubuntu packages whose libraries the xcb plugin needs and no library folder holds."""
    existing = [Path(f) for f in (library_folders() if folders is None else folders) if Path(f).is_dir()]
    return list(dict.fromkeys(package for library, package in XCB_LIBRARIES.items()
                              if not any((folder / library).exists() for folder in existing)))


def window_problem(environ=None, platform: str | None = None, folders=None) -> Msg | None:
    """Why the window cannot open here, as one line for the terminal (a `Msg`: told in the user's language where it
    is printed); None when it can."""
    environ = os.environ if environ is None else environ
    platform = sys.platform if platform is None else platform
    qpa = environ.get("QT_QPA_PLATFORM", "")
    if not platform.startswith("linux") or qpa.startswith(("offscreen", "minimal", "vnc", "eglfs", "linuxfb")):
        return None
    wayland, x11 = environ.get("WAYLAND_DISPLAY"), environ.get("DISPLAY")
    if not wayland and not x11:
        return Msg("kneeboard: no display found (neither DISPLAY nor WAYLAND_DISPLAY is set), so the app cannot open; "
                   "{headless}.", headless=HEADLESS)
    if wayland and not qpa.startswith("xcb"):
        return None
    missing = missing_packages(folders)
    if missing:
        return Msg("kneeboard: the window needs system libraries that are not installed; install them with:\n"
                   "  sudo apt install {packages}\nMeanwhile {headless}.", packages=" ".join(missing),
                   headless=HEADLESS)
    return None


def display_reachable(environ=None, platform: str | None = None) -> bool:
    """Does a display server answer where DISPLAY or WAYLAND_DISPLAY points? (Linux; elsewhere always True.)

    A DISPLAY naming a server that is not there (`:99` with nothing listening, a stale SSH forwarding) makes Qt
    abort the process; headless work (a card's logo, a PNG of a page) then draws offscreen instead. The server's
    socket is only connected to and closed: nothing is sent.
    """
    environ = os.environ if environ is None else environ
    platform = sys.platform if platform is None else platform
    if not platform.startswith("linux"):
        return True
    wayland = environ.get("WAYLAND_DISPLAY")
    if wayland:
        folder = environ.get("XDG_RUNTIME_DIR", "")
        path = wayland if os.path.isabs(wayland) else os.path.join(folder, wayland) if folder else ""
        if path and _answers(socket.AF_UNIX, path):
            return True
    match = re.fullmatch(r"(?:unix)?([^:/]*):(\d+)(?:\.\d+)?", environ.get("DISPLAY", ""))
    if match is None:
        return False
    host, number = match.group(1), int(match.group(2))
    if host in ("", "unix"):
        path = f"/tmp/.X11-unix/X{number}"
        return _answers(socket.AF_UNIX, "\0" + path) or _answers(socket.AF_UNIX, path)
    return _answers(socket.AF_INET, (host, 6000 + number))


def _answers(family, address) -> bool:
    try:
        with socket.socket(family, socket.SOCK_STREAM) as s:
            s.settimeout(1.0)
            s.connect(address)
        return True
    except (OSError, ValueError):
        return False
