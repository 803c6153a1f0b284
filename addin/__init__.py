"""boreflow faces: worksheet functions, case files, the report writer and the command line.

Thin adapters only: parse → call :mod:`calc` → format.  No engineering formula lives here.
"""
