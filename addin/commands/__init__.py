"""The ``boreflow`` subcommands, one module each: :mod:`~addin.commands.rheology`,
:mod:`~addin.commands.report`, :mod:`~addin.commands.calc`, :mod:`~addin.commands.batch`.

Each module's ``run(args) -> int`` does the work of its subcommand and returns the exit code
(:mod:`addin.commands.exit_codes`).  The parser that declares every subcommand and its options is
:mod:`addin.cli`, the one place they are registered; nothing here imports it.
"""
