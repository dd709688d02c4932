"""Torsional vibration of shaft trains: stiffness, modes, excitation orders, interference.

Pure functions, SI units: inertias [kg m^2], torsional stiffnesses [N m/rad],
frequencies and speeds [Hz].
"""
