"""The project configuration of the Larkspur Row demo, written to ``demo.toml``.

Kept as text so that ``author_demo.py`` regenerates every file of the scenario; the
format is the project's agreed TOML config (every quantity a string with its unit).
"""

DEMO_TOML = """\
# shearline project configuration for the Larkspur Row demo (an invented building).
# Written by sample_models/author_demo.py. One file serves demo_building.ifc,
# demo_building_ft_ifc2x3.ifc and demo_building_rev2.ifc: every quantity carries its
# unit, so the IFC file's length unit does not matter.

[project]
name = "Larkspur Row"
display_units = "imperial"
author = "engineer@example.com"

[levels]
base = "Level 1"
diaphragms = ["Level 2", "Level 3", "Roof"]

[seismic]
procedure = "elf"
SDS = 1.00
SD1 = 0.60
S1 = 0.62
TL = "8 s"
R = 6.5        # light-frame wood walls sheathed with wood structural panels,
Ie = 1.0       #   ASCE 7-16 Table 12.2-1 (from memory: R 6.5, omega0 3, Cd 4)
Cd = 4.0
omega0 = 3.0
Ct = 0.02      # ASCE 7-16 Table 12.8-2, all other structural systems (hn in ft)
x = 0.75

[loads]
floor = "15 psf"
roof = "20 psf"
wall = "10 psf"

[analysis]
diaphragm = "envelope"
accidental_eccentricity = 0.05
wall_stiffness = "length"
line_tolerance = "0.5 m"
angle_tolerance = "10 deg"
design_basis = "ASD"
amplify_torsion = true

[shear_walls]
predefined_type = true

[bcf]
version = "2.1"

# 15/32 in Structural I, 10d common at 6 in panel edges: capacity from the starter
# library (SDPWS Table 4.3A, from memory: vs = 680 plf, ASD 680 / 2.0 = 340 plf).
[[assemblies]]
name = "SW-A"
kind = "wood_structural_panel"
match = { type_name = "SW-A*" }
sheathing = "15/32 Structural I"
fastener = "10d common"
edge_spacing = "6 in"
blocked = true

# The same panel at 3 in panel edges, capacity given by the engineer
# (SDPWS Table 4.3A, from memory: vs = 1330 plf, ASD 1330 / 2.0 = 665 plf).
[[assemblies]]
name = "SW-B"
kind = "wood_structural_panel"
match = { type_name = "SW-B*" }
unit_shear_capacity = "665 plf"
blocked = true
"""
