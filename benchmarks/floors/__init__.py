"""Bare scripts run as whole processes: the floors the start-up and the fleet are measured against."""
