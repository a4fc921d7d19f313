"""buildsheet: design, document and tune end-fed half-wave antennas matched by a shorted stub.

The package root re-exports the public API; everything else lives in the modules named in
DESIGN.md §3 (read -> validate -> solve -> lay out -> write).
"""

__version__ = "0.1.0"

from buildsheet.design import load_design  # noqa: E402

__all__ = ["load_design", "__version__"]
