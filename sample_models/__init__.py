"""The demo scenario: an invented building, its authoring script, IFC files and configs.

Shipped as package data so ``shearline demo`` works after a plain ``pip install``.
"""
