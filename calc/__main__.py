import os
import sys

from .edges.cli import main

try:
    code = main()
    sys.stdout.flush()
except BrokenPipeError:
    # The reader went away (``python -m calc evaluate job.json | head``): say nothing more. Python's documented
    # recipe (the signal module's note on SIGPIPE): point stdout at devnull so the exit's own flush cannot fail.
    os.dup2(os.open(os.devnull, os.O_WRONLY), sys.stdout.fileno())
    code = 1
sys.exit(code)
