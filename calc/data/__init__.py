"""Data: the part tables and the trade's practice constants.

``tables`` is the one loader of the JSON tables in this folder (hoses, tubes, fittings,
threads and fitting ends, fluid presets); every row names where its figures come from.
``practice`` holds the rules of thumb the checks use, each with its basis. ``frozen``
makes table rows and prepared jobs read-only. Nothing here computes physics.
"""
