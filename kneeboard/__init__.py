"""kneeboard: cockpit cards of stall speed and margin by bank angle, from an aircraft's published figures."""

__version__ = "0.1.0"
