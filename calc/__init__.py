"""Fluxbook's calculations: one standard-library package for CPython and Pyodide alike."""

__version__ = "0.1.0"
