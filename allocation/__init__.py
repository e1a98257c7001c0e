"""Pure engineering: seismic weights, ELF forces, diaphragm forces and force allocation.

Works on :mod:`ifc_bridge.model` only; never touches a file, never imports ifcopenshell
or pint.
"""
