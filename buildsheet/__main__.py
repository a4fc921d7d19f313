"""`python -m buildsheet` runs the command line."""

from buildsheet.cli import entry

entry()
