"""Profile templates, one per category (data only)."""
