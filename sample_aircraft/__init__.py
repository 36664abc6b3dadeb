"""The sample fleet: invented aircraft that show the file format (data only)."""
