"""buildsheet: design, document and tune end-fed half-wave antennas matched by a shorted stub.

The package root is the public API (DESIGN.md §6):

    from buildsheet import load_design, solve
    solution = solve(load_design("designs/oak-yard-20m.yaml"))
    solution.to_dict()          # the dict that `buildsheet solve --json` prints

Both are loaded on first use, so that `import buildsheet` (and the commands that need neither)
stays free of numpy and scipy. Everything else lives in the modules named in DESIGN.md §3.
"""

__version__ = "0.1.0"

__all__ = ["load_design", "solve", "__version__"]


def __getattr__(name: str):
    if name == "load_design":
        from buildsheet.design import load_design
        return load_design
    if name == "solve":
        from buildsheet.solver import solve
        return solve
    raise AttributeError(f"module 'buildsheet' has no attribute {name!r}")
