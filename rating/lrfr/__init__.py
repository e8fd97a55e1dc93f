"""LRFR: load factors, dynamic load allowance, rating factors, posting."""
