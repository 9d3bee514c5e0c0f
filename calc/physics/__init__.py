"""Physics: pure functions on numbers, with units in their names.

Each function takes and returns SI numbers (or the unit its name says), imports nothing
from the rest of the engine, and carries a docstring in the style of fluids and ht:
parameters with units, validity, a worked example that reproduces a published or exact
value, and the reference. Modules: ``fluid`` (viscosity, density), ``pump`` (delivery),
``friction`` (Darcy friction factor, regime), ``losses`` (minor losses, each its own
function), ``convection`` (air properties and film coefficients), ``heat`` (throttling,
hydraulic heat, fins, wall conduction), ``lumped`` (steady balance and warm-up),
``strength`` (Barlow, Lame, derating), ``route`` (route geometry), ``threadform`` (thread
readings), ``sizes`` (dash sizes).
"""
