"""The job model: the one definition of a Linesmith job file.

A job is a JSON document, ``"version": 1``. Every key that carries a physical
quantity ends with its unit (``bore_mm``, ``relief_bar``). The engine converts
to SI on entry. The validator (``calc.model.job_rules.validate_job``), the command line, the page's
form (rendered at build time from ``describe_job()``) and the field reference in
DEVELOPERS.md all read the declaration below; add a field here and it appears
everywhere.

Default operating points (used when a job gives no ``conditions``):

=============  ==========  =============  =========  ===========
name           engine_rpm  fluid_temp_c   full_lock  duty_percent
=============  ==========  =============  =========  ===========
cold start     900         -20            no         0
hot idle       750         90             no         30
highway        2500        80             no         65
full lock hot  750         100            yes        5
=============  ==========  =============  =========  ===========

The engine speeds and temperatures are common practice for a passenger-car
circuit (no single source); the duty shares are an invented typical mix for the
steady-temperature estimate, to be replaced by the user's own.
"""
from __future__ import annotations

from ..data.tables import fitting_families, fluid_presets, seal_words, tube_materials
from .schema import REQUIRED, Field, ListOf, Record, Variants

__all__ = ["JOB_VERSION", "JOB", "PART", "PORT", "LINE", "CONDITION", "DEFAULT_CONDITIONS", "FLUID_PRESETS",
           "LINE_ROLES", "FITTING_SHAPES", "FITTING_FAMILIES", "TUBE_MATERIALS", "SEAL_TYPES", "describe_job",
           "field_label", "path_words", "field_unit"]

JOB_VERSION = 1

FLUID_PRESETS = tuple(fluid_presets())
LINE_ROLES = ("pressure", "return", "feed")
FITTING_SHAPES = ("straight", "elbow-45", "elbow-90", "tee-run", "tee-branch", "banjo", "bulkhead")
#: One list of end families for fitting parts and for port ends (``calc/data/fittings.json``).
FITTING_FAMILIES = tuple(fitting_families())
_FAMILY_WORDS = tuple((k, v["name"]) for k, v in fitting_families().items())
TUBE_MATERIALS = ("steel-low-carbon", "stainless-304-annealed", "aluminium-6061-t6", "copper-nickel")
SEAL_TYPES = ("flare-37", "flare-45", "cone-24", "oring-boss", "metric-oring", "crush-washer",
              "pipe-taper", "hose-barb", "unknown")

# -- scalar building blocks -----------------------------------------------------
_name = Field("name", "Name", "text", default="", help="Free text shown on the report and build sheet.")


def _bends() -> ListOf:
    return ListOf("bends", "Bends", Record("bend", "Bend", (
        Field("angle_deg", "Bend angle", unit="angle_deg", default=90.0, gt=0, le=360,
              help="Angle turned by the flow, in degrees."),
        Field("radius_mm", "Centre-line radius", unit="length_mm", default=REQUIRED, ge=0.5, le=5000,
              help="Radius of the bend's centre line."),
    )), default=[], max_items=50, help="Bends along this part; each adds a bend loss and is checked "
                                        "against the part's minimum bend radius.")


def _local_air() -> Field:
    return Field("local_air_temp_c", "Air temperature around this part", unit="temp_c", default=None, ge=-50,
                 le=400,
                 help="For a part routed near an exhaust manifold, turbo or catalyst: the air temperature around "
                      "it there. The part's heat exchange and its wall temperature use it; empty means the job's "
                      "under-hood air. Radiation from the hot surface itself is not modelled, so the wall near it "
                      "runs hotter than the estimate: keep the line away, or sleeve or shield it.")


_rise = Field("rise_m", "Rise", unit="length_m", default=0.0, ge=-10, le=10,
              help="Height gained from this part's inlet to its outlet (negative for a fall).")

HOSE = Record("hose", "Hose", (
    Field("class", "Hose class", "text", default=None,
          help="A hose class from the part tables (for example 'SAE 100R2AT'); fills bore and ratings."),
    Field("dash", "Dash size", "integer", default=None, gt=0, le=64,
          help="Dash size: inside diameter in sixteenths of an inch (-6 = 3/8 in)."),
    Field("bore_mm", "Bore", unit="length_mm", default=None, ge=0.5, le=100, warn_below=3, warn_above=40,
          help="Inside diameter. Filled from the class and dash size when left empty."),
    Field("length_m", "Length", unit="length_m", default=None, ge=0.001, le=50, warn_above=10,
          help="Flow length of the hose between fitting stems. The line's hose assembly may leave it empty when "
               "the line gives its route points or overall length: its cut length is then worked out from them."),
    Field("roughness_mm", "Wall roughness", unit="length_mm", default=0.005, ge=0, le=1,
          help="Absolute roughness of the bore; 0.005 mm is typical of rubber hose (from memory)."),
    _bends(), _rise,
    Field("working_bar", "Rated working pressure", unit="pressure_bar", default=None, gt=0, le=2000,
          help="From the maker's datasheet; overrides the class table."),
    Field("burst_bar", "Minimum burst pressure", unit="pressure_bar", default=None, gt=0, le=10000,
          help="From the maker's datasheet; overrides the class table."),
    Field("min_bend_radius_mm", "Minimum bend radius", unit="length_mm", default=None, gt=0, le=5000,
          help="From the maker's datasheet; overrides the class table."),
    Field("max_temp_c", "Maximum fluid temperature", unit="temp_c", default=None, gt=-60, le=300,
          help="From the maker's datasheet; overrides the class table."),
    Field("wall_mm", "Hose wall thickness", unit="length_mm", default=None, gt=0, le=30,
          help="For heat rejection through the wall; a typical value for the bore is used when empty."),
    _local_air(),
))

TUBE = Record("tube", "Rigid tube", (
    Field("od_mm", "Outside diameter", unit="length_mm", default=REQUIRED, ge=1, le=100, warn_below=3,
          help="Outside diameter of the tube (tube dash size = OD in sixteenths of an inch)."),
    Field("wall_mm", "Wall thickness", unit="length_mm", default=REQUIRED, ge=0.05, le=20,
          help="Wall thickness; must be less than half the outside diameter."),
    Field("length_m", "Length", unit="length_m", default=REQUIRED, ge=0.001, le=50, warn_above=10,
          help="Developed (straightened) length of the tube."),
    Field("roughness_mm", "Wall roughness", unit="length_mm", default=0.0015, ge=0, le=1,
          help="Absolute roughness; 0.0015 mm is the usual value for drawn tubing (from memory)."),
    _bends(), _rise,
    Field("material", "Material", "choice", default="steel-low-carbon", choices=TUBE_MATERIALS,
          choice_words=tuple((k, v["name"]) for k, v in tube_materials().items()), help="Tube material from the part table, for its minimum tensile strength."),
    Field("tensile_mpa", "Minimum tensile strength", unit="stress_mpa", default=None, gt=0, le=3000,
          help="Overrides the material table (from the tube maker's certificate)."),
    Field("max_temp_c", "Maximum temperature", unit="temp_c", default=None, gt=-60, le=600,
          help="Overrides the material table."),
    _local_air(),
))

FITTING = Record("fitting", "Fitting or adapter", (
    Field("bore_mm", "Bore", unit="length_mm", default=REQUIRED, ge=0.5, le=100, warn_below=2,
          help="Smallest inside diameter of the fitting (the stem or the drilled passage)."),
    Field("shape", "Shape", "choice", default="straight", choices=FITTING_SHAPES,
          help="Flow path through the fitting, for its loss coefficient."),
    Field("passage_length_mm", "Passage length", unit="length_mm", default=25.0, ge=0, le=1000,
          help="Length of the narrow passage, for its friction (25 mm is a typical stem, from memory)."),
    Field("family", "Family", "choice", default=None, choices=FITTING_FAMILIES, choice_words=_FAMILY_WORDS,
          help="End family, for the working pressure per size from the part table."),
    Field("dash", "Size (dash)", "integer", default=None, gt=0, le=64,
          help="Dash size of the end, for the family's rating table."),
    Field("working_bar", "Rated working pressure", unit="pressure_bar", default=None, gt=0, le=2000,
          help="From the maker's data; overrides the family table."),
    Field("max_temp_c", "Maximum temperature", unit="temp_c", default=None, gt=-60, le=300,
          help="Seal temperature limit; overrides the family table."),
    Field("cutoff_mm", "Cut-off allowance", unit="length_mm", default=0.0, ge=0, le=500,
          help="Length the fitting adds beyond the cut hose end, for the cut-length calculation."),
    Field("end", "Assembly end", "choice", default="inline", choices=("start", "end", "inline"),
          help="Whether this fitting terminates the hose assembly at its start or end."),
    Field("orientation_deg", "Orientation", default=0.0, unit="angle_deg", ge=-360, le=360,
          help="Clocking angle of an elbow relative to the other end, for the build sheet."),
))

DEVICE = Record("device", "Cooler or series device", (
    Field("dp_bar", "Measured pressure drop", unit="pressure_bar", default=REQUIRED, ge=0, le=200,
          help="Pressure drop measured across the device at the stated flow and viscosity."),
    Field("at_flow_lpm", "At flow", unit="flow_lpm", default=REQUIRED, ge=0.1, le=500,
          help="Flow at which the drop was measured."),
    Field("at_visc_cst", "At viscosity", unit="viscosity_cst", default=None, ge=0.5, le=100000,
          help="Viscosity at which the drop was measured; needed for the viscous scaling."),
    Field("scaling", "Scaling with flow", "choice", default="inertial", choices=("viscous", "inertial"),
          help="'viscous': drop proportional to viscosity x flow (laminar passages); 'inertial': drop "
               "proportional to density x flow squared (valves and orifices)."),
    Field("is_cooler", "Is a cooler", "bool", default=False,
          help="Marks a heat exchanger; its heat rejection is set in the thermal section."),
    Field("working_bar", "Rated working pressure", unit="pressure_bar", default=None, gt=0, le=2000,
          help="From the maker's data, for the weakest-part check."),
))

ENTRANCE = Record("entrance", "Reservoir outlet (flow enters the line)", (
    Field("bore_mm", "Bore", unit="length_mm", default=REQUIRED, ge=0.5, le=100),
    Field("edge", "Edge", "choice", default="sharp", choices=("sharp", "rounded", "projecting"),
          help="Shape of the opening where fluid leaves the reservoir: flush with a sharp edge, rounded, or a "
               "pipe standing into the reservoir."),
    Field("wall_mm", "Wall of a projecting pipe", unit="length_mm", default=None, gt=0, le=20,
          help="Wall thickness of a pipe standing into the reservoir; a thin wall loses more than a thick one. "
               "Empty: a thin wall of 1 % of the bore (stated default)."),
))

EXIT = Record("exit", "Discharge into reservoir", (
    Field("bore_mm", "Bore", unit="length_mm", default=REQUIRED, ge=0.5, le=100),
))

PART = Variants("part", "Part", "kind", {
    "hose": HOSE, "tube": TUBE, "fitting": FITTING, "device": DEVICE,
    "entrance": ENTRANCE, "exit": EXIT,
}, help="One piece of a line, in flow order.")

PORT = Record("port", "Port", (
    Field("label", "Port", "text", default="", help="Where this end connects (pump outlet, gear inlet, ...)."),
    Field("thread", "Port thread", "text", default=None,
          help="Thread designation from the thread tables (for example '5/8-18 UNF' or 'M16x1.5')."),
    Field("seal", "Port seal", "choice", default=None, choices=SEAL_TYPES,
          choice_words=tuple((k, v) for k, v in seal_words().items() if k in SEAL_TYPES), help="How the port seals."),
    Field("line_end_family", "Line end", "choice", default=None,
          choices=tuple(f for f in FITTING_FAMILIES if f != "crimp-stem"), choice_words=_FAMILY_WORDS,
          help="End family of the hose or tube fitting that meets this port; the adapters between them are "
               "planned from the thread tables."),
    Field("line_end_dash", "Line end size (dash)", "integer", default=None, gt=0, le=64,
          help="Dash size of the line end (inch families and hose barbs)."),
    Field("line_end_tube_od_mm", "Line end tube outside diameter", unit="length_mm", default=None, gt=0, le=100,
          help="Tube outside diameter of a 24 deg cone end (for example 10 for 10L)."),
    Field("line_end_thread", "Line end thread", "text", default=None,
          help="Thread of the line end, for metric studs, banjo bolts and pipe threads (for example 'M14x1.5')."),
), default=None)

LINE = Record("line", "Line", (
    _name,
    Field("role", "Role", "choice", default=REQUIRED, choices=LINE_ROLES,
          help="pressure: pump to gear; return: gear to reservoir; feed: reservoir to pump inlet."),
    ListOf("parts", "Parts", PART, default=REQUIRED, min_items=1, max_items=60,
           help="The parts of the line in flow order. Only the parts listed are computed."),
    Field("dp_budget_bar", "Pressure-drop budget", unit="pressure_bar", default=None, gt=0, le=500,
          help="Largest acceptable pressure drop along this line at a warm operating point. Empty: 5 bar on a "
               "pressure line, 3 bar on a return line (common practice); a feed line is held to the pump-inlet "
               "limit instead."),
    Field("dp_budget_cold_bar", "Pressure-drop budget at cold start", unit="pressure_bar", default=None, gt=0,
          le=500, help="Largest acceptable drop at a cold-start operating point (10 C or colder). Empty: 25 bar on a "
                       "pressure line, 10 bar on a return line (common practice)."),
    Field("engine_movement_mm", "Engine movement", unit="length_mm", default=0.0, ge=0, le=500,
          help="Relative movement of the two ends on the engine mounts; needs slack in the hose."),
    Field("engine_movement_axis", "Direction of engine movement", "choice", default="z", choices=("x", "y", "z"),
          help="The axis of the route points along which the end on the engine moves; the route sketch shows "
               "the hose with that end moved half the engine movement each way."),
    Field("engine_end", "End on the engine", "choice", default="start", choices=("start", "end"),
          help="Which end of the line moves with the engine: its start (a pump outlet) or its end."),
    Field("overall_length_mm", "Overall assembly length", unit="length_mm", default=None, gt=0, le=50000,
          help="Measured end-to-end length of the hose assembly, for the cut length."),
    Field("route_points_mm", "Route points", "points", unit="length_mm", default=None,
          help="Measured points [x, y, z] along the intended path from a datum of your choice."),
    Record("from_port", "Start port", PORT.fields, default=None,
           help="The port this line starts at."),
    Record("to_port", "End port", PORT.fields, default=None,
           help="The port this line ends at."),
))

CONDITION = Record("condition", "Operating point", (
    _name,
    Field("engine_rpm", "Engine speed", unit="speed_rpm", default=REQUIRED, ge=1, le=12000,
          help="Crankshaft speed."),
    Field("fluid_temp_c", "Fluid temperature", unit="temp_c", default=REQUIRED, ge=-50, le=200,
          help="Bulk fluid temperature at this point."),
    Field("full_lock", "Wheel held at full lock", "bool", default=False,
          help="The gear is at the end of travel: the whole delivered flow crosses the relief."),
    Field("duty_percent", "Share of time", unit="percent", default=0.0, ge=0, le=100,
          help="Share of running time at this point, for the steady fluid temperature."),
    Field("air_speed_m_s", "Air speed over lines", unit="speed_m_s", default=0.0, ge=0, le=60,
          help="Air speed across the lines and cooler; 0 for still air (natural convection)."),
))

DEFAULT_CONDITIONS = [
    {"name": "cold start", "engine_rpm": 900.0, "fluid_temp_c": -20.0, "full_lock": False,
     "duty_percent": 0.0, "air_speed_m_s": 0.0},
    {"name": "hot idle", "engine_rpm": 750.0, "fluid_temp_c": 90.0, "full_lock": False,
     "duty_percent": 30.0, "air_speed_m_s": 0.5},
    {"name": "highway", "engine_rpm": 2500.0, "fluid_temp_c": 80.0, "full_lock": False,
     "duty_percent": 65.0, "air_speed_m_s": 5.0},
    {"name": "full lock hot", "engine_rpm": 750.0, "fluid_temp_c": 100.0, "full_lock": True,
     "duty_percent": 5.0, "air_speed_m_s": 0.5},
]

FLUID = Record("fluid", "Fluid", (
    Field("preset", "Fluid", "choice", default=None, choices=FLUID_PRESETS + ("custom",),
          choice_words=tuple((k, v["name"]) for k, v in fluid_presets().items()) + (("custom", "custom: datasheet values"),),
          help="A generic fluid from the presets, or 'custom' to give its datasheet values."),
    _name,
    Field("visc_40c_cst", "Viscosity at 40 C", unit="viscosity_cst", default=None, ge=2, le=10000,
          help="Kinematic viscosity at 40 C from the datasheet."),
    Field("visc_100c_cst", "Viscosity at 100 C", unit="viscosity_cst", default=None, ge=1, le=1000,
          help="Kinematic viscosity at 100 C from the datasheet; must be lower than at 40 C."),
    Field("density_15c_kg_m3", "Density at 15 C", unit="density_kg_m3", default=None, gt=500, le=1500),
    Field("specific_heat_j_kgk", "Specific heat", unit="specific_heat_j_kgk", default=None, gt=500, le=5000),
    Field("expansion_per_k", "Thermal expansion", unit="per_k", default=None, ge=0, le=0.005,
          help="Volumetric expansion coefficient; 0.0007 /K is typical of mineral oil (from memory)."),
    Field("conductivity_w_mk", "Thermal conductivity", unit="conductivity_w_mk", default=None, gt=0, le=1,
          help="0.13 W/(m K) is typical of mineral oil (from memory)."),
    Field("max_temp_c", "Fluid temperature limit", unit="temp_c", default=None, gt=0, le=250,
          help="Highest continuous fluid temperature; the steady and full-lock checks use it."),
))

PUMP = Record("pump", "Pump and drive", (
    Field("displacement_cc_rev", "Displacement", unit="displacement_cc", default=REQUIRED, ge=0.5, le=200,
          warn_below=4, warn_above=40, help="Geometric displacement per pump revolution."),
    Field("pulley_ratio", "Pulley ratio (pump : crank speed)", unit="ratio", default=None, ge=0.05, le=5,
          help="Pump speed divided by crankshaft speed. Empty: worked out from the two pulley diameters when "
               "they are given, else 1 (pump at crank speed)."),
    Field("crank_pulley_mm", "Crank pulley diameter", unit="length_mm", default=None, gt=10, le=1000,
          help="Effective diameter of the crankshaft pulley that drives the pump's belt; with the pump pulley's, "
               "it gives the pulley ratio (crank diameter over pump diameter)."),
    Field("pump_pulley_mm", "Pump pulley diameter", unit="length_mm", default=None, gt=10, le=1000,
          help="Effective diameter of the pump's pulley, measured the same way as the crank pulley."),
    Field("volumetric_efficiency", "Volumetric efficiency", unit="ratio", default=0.9, ge=0.05, le=1,
          help="Delivered over geometric flow; 0.85-0.95 is typical of vane pumps (from memory)."),
    Field("flow_limit_lpm", "Flow-control setting", unit="flow_lpm", default=None, ge=0.1, le=500,
          help="Most flow the flow-control valve lets out; the rest recirculates in the pump. Needed unless the "
               "pump's flow table is given, which takes its place."),
    Field("flow_table_rpm_lpm", "Flow table (pump speed, delivered flow)", "table", default=None,
          columns=(Field("pump_rpm", "Pump speed", unit="speed_rpm", gt=0, le=20000),
                   Field("delivered_lpm", "Delivered flow", unit="flow_lpm", gt=0, le=500)),
          min_rows=2, max_rows=40,
          help="The pump maker's flow against pump speed, for a pump whose flow falls at high speed. Between "
               "rows the flow is read on a straight line, beyond the first and last rows it holds their value, "
               "and it is never more than the pump delivers at that speed. Pump speed = engine speed x pulley "
               "ratio."),
    Field("metering_drop_bar", "Flow-control metering drop", unit="pressure_bar", default=0.0, ge=0, le=50,
          help="Drop across the flow-control valve's metering orifice while it limits the flow; the pump works "
               "against the outlet pressure plus this drop. Not counted unless given (0), so the heat is a lower "
               "bound; spools typically drop about 1-3 bar (from memory): give the maker's figure."),
    Field("relief_bar", "Relief setting", unit="pressure_bar", default=REQUIRED, ge=1, le=500,
          warn_above=200, help="Pressure at which the relief valve opens."),
    Field("overall_efficiency", "Overall efficiency", unit="ratio", default=None, gt=0, le=1,
          help="Volumetric x mechanical efficiency. If given, the mechanical (friction) losses are added to the "
               "heat load; the leakage is already in it, from the volumetric efficiency."),
))

GEAR = Record("gear", "Steering gear", (
    Field("neutral_drop_bar", "Valve drop at neutral", unit="pressure_bar", default=REQUIRED, ge=0, le=100,
          help="Pressure drop across the open-centre valve with no steering input, at the stated flow."),
    Field("at_flow_lpm", "Flow for the neutral drop", unit="flow_lpm", default=REQUIRED, ge=0.5, le=500,
          help="Flow at which the neutral drop was measured."),
    Field("at_temp_c", "Fluid temperature for the neutral drop", unit="temp_c", default=80.0, ge=-50, le=200,
          help="Fluid temperature at which the neutral drop was measured (80 C, a hot running temperature, "
               "when not stated). Other flows and temperatures follow an orifice whose loss rises when the "
               "fluid is cold (two-constant form fitted to this point)."),
    Field("cold_drop_bar", "Second measured drop (cold)", unit="pressure_bar", default=None, ge=0, le=200,
          help="A second neutral drop measured at another fluid temperature: with it the valve's laminar and "
               "inertial parts are fitted to both points instead of estimated."),
    Field("cold_at_flow_lpm", "Second point: at flow", unit="flow_lpm", default=None, ge=0.5, le=500,
          help="Flow of the second measurement; empty: the same flow as the first."),
    Field("cold_at_temp_c", "Second point: at fluid temperature", unit="temp_c", default=None, ge=-50, le=200,
          help="Fluid temperature of the second measurement; at least 10 K from the first."),
    Field("rated_bar", "Gear's maximum working pressure", unit="pressure_bar", default=None, gt=0, le=500,
          help="The highest pressure the gear is built for, from its maker; the pump's relief setting must not "
               "exceed it."),
    Field("flow_needed_lpm", "Flow the gear needs for full assist", unit="flow_lpm", default=None, gt=0, le=200,
          help="Flow the gear needs for full assist when parking (from its maker); checked against the pump's "
               "flow at the slowest operating point, and against the flow-control setting."),
))

RATINGS = Record("ratings", "Rating settings", (
    Field("surge_percent", "Surge allowance over relief", unit="percent", default=25.0, ge=0, le=200,
          help="Pressure lines must hold the relief setting plus this allowance for spikes when the "
               "relief cracks late (25 % is common practice, no single source)."),
    Field("hose_design_factor", "Hose design factor (burst : working)", unit="ratio", default=4.0, ge=1, le=10,
          help="SAE J517 rates hydraulic hose at a quarter of its minimum burst pressure (4:1)."),
    Field("tube_design_factor", "Tube design factor (burst : working)", unit="ratio", default=4.0, ge=1,
          le=10, help="4:1 on minimum tensile burst is the usual basis of tube pressure tables "
                      "(from memory of SAE J1065)."),
    Field("length_change_plus_percent", "Hose growth under pressure", unit="percent", default=2.0, ge=0, le=20,
          help="+2 % is the SAE J517 allowance (from memory)."),
    Field("length_change_minus_percent", "Hose shrink under pressure", unit="percent", default=4.0, ge=0,
          le=20, help="-4 % is the SAE J517 allowance (from memory)."),
), default={})

COOLER = Record("cooler", "Cooler", (
    Field("type", "Cooler", "choice", default="none", choices=("none", "rating", "tube"),
          help="'rating': a cooler given by its W/K; 'tube': a length of plain or finned tube in the air."),
    Field("w_per_k", "Cooler rating", unit="conductance_w_k", default=None, gt=0, le=10000,
          help="Heat rejected per kelvin of fluid-to-air temperature difference."),
    Field("tube_od_mm", "Cooler tube outside diameter", unit="length_mm", default=9.53, gt=0, le=100),
    Field("tube_wall_mm", "Cooler tube wall", unit="length_mm", default=0.89, gt=0, le=10),
    Field("tube_length_m", "Cooler tube length", unit="length_m", default=None, gt=0, le=100),
    Field("fins_per_inch", "Fins per inch", unit="count", default=0.0, ge=0, le=40,
          help="0 for plain tube."),
    Field("fin_od_mm", "Fin outside diameter", unit="length_mm", default=None, gt=0, le=200),
    Field("fin_thickness_mm", "Fin thickness", unit="length_mm", default=0.4, gt=0, le=5,
          help="0.3-0.5 mm is typical of wound or pressed aluminium fins (from memory)."),
    Field("fin_conductivity_w_mk", "Fin conductivity", unit="conductivity_w_mk", default=200.0, gt=0,
          le=500, help="About 200 W/(m K) for aluminium (from memory)."),
    Field("tube_conductivity_w_mk", "Cooler tube wall conductivity", unit="conductivity_w_mk", default=50.0,
          gt=0, le=500, help="About 50 W/(m K) for low-carbon steel, 160-200 for aluminium (from memory)."),
    Field("air_speed_m_s", "Air speed through the cooler", unit="speed_m_s", default=None, ge=0, le=60,
          help="Leave empty to use each condition's air speed."),
), default={})

THERMAL = Record("thermal", "Thermal settings", (
    Field("air_temp_c", "Under-hood air temperature", unit="temp_c", default=50.0, ge=-50, le=150,
          help="Air around the lines and the reservoir."),
    Field("limit_margin_c", "Margin below the fluid limit", unit="temp_diff_c", default=10.0, ge=0, le=100,
          help="The steady temperature should stay this far below the fluid's limit."),
    Field("reservoir_area_m2", "Reservoir wetted surface", unit="area_m2", default=0.04, ge=0, le=10,
          help="Outer surface of the reservoir in contact with fluid."),
    Field("reservoir_h_w_m2k", "Reservoir film coefficient", unit="film_w_m2k", default=10.0, gt=0, le=500,
          help="Overall coefficient of the reservoir surface; 5-15 W/(m2 K) for still air (from memory)."),
    Field("other_volume_l", "Fluid in pump, gear and reservoir", unit="volume_l", default=0.8, ge=0, le=100,
          help="Fluid volume outside the listed lines, for the full-lock warm-up of the whole fluid."),
    Field("pump_volume_l", "Fluid in the pump", unit="volume_l", default=0.15, gt=0, le=10,
          help="Fluid inside the pump and its own passages, which takes the heat at full lock while the lines "
               "stand still; 0.15 L is typical of a car's vane pump (from memory)."),
    Field("pump_heat_capacity_j_k", "Pump body heat capacity", unit="heat_capacity_j_k", default=500.0, ge=0,
          le=100000, help="Heat capacity of the part of the pump body that warms with its fluid at full lock; "
                          "500 J/K is about 1 kg of aluminium (from memory)."),
    Field("hose_conductivity_w_mk", "Hose wall conductivity", unit="conductivity_w_mk", default=0.25, gt=0,
          le=50, help="Rubber hose wall; about 0.2-0.3 W/(m K) (from memory)."),
    Field("full_lock_hold_s", "Longest full-lock hold to show", unit="time_s", default=600.0, gt=0,
          le=36000),
    COOLER,
), default={})

JOB = Record("job", "Job", (
    Field("version", "File version", "integer", default=REQUIRED, ge=1, le=1,
          help="Job file format version; this build reads version 1."),
    _name,
    Field("customer", "Customer", "text", default="", max_length=200, help="Printed in the build sheet's header."),
    Field("vehicle", "Vehicle", "text", default="", max_length=200, help="Printed in the build sheet's header."),
    Field("job_number", "Job number", "text", default="", max_length=100, help="Printed in the build sheet's header."),
    Field("date", "Date", "text", default="", max_length=100, help="Printed in the build sheet's header, as you "
                                                                     "write it (for example 2026-12-02)."),
    Field("notes", "Notes", "text", default="", max_length=5000),
    Field("notes_on_sheet", "Print the notes on the build sheet", "bool", default=False,
          help="Off: the notes stay in the job and are left off the printed sheet."),
    FLUID, PUMP, GEAR,
    ListOf("conditions", "Operating points", CONDITION, default=DEFAULT_CONDITIONS, min_items=1,
           max_items=24, help="Operating points at which every line is computed."),
    ListOf("lines", "Lines", LINE, default=REQUIRED, min_items=1, max_items=12),
    RATINGS, THERMAL,
))


def _labels() -> dict:
    out = {}

    def walk(rec):
        fields = rec.fields if hasattr(rec, "fields") else ()
        out.setdefault(rec.key, {}).update({f.key: f.label for f in fields})
        for f in fields:
            if isinstance(f, Record):
                walk(f)
            elif isinstance(f, ListOf):
                item = f.item
                for r in (item.variants.values() if isinstance(item, Variants) else [item]):
                    walk(r)
    walk(JOB)
    return out


_LABELS = _labels()


def _units() -> dict:
    out = {}

    def walk(spec):
        item = spec.item if isinstance(spec, ListOf) else spec
        for rec in (item.variants.values() if isinstance(item, Variants) else [item]):
            for f in getattr(rec, "fields", ()):
                if isinstance(f, Field):
                    out.setdefault(f.key, f.unit)
                else:
                    walk(f)
    walk(JOB)
    return out


_UNITS = _units()


def field_unit(path: str) -> str | None:
    """The unit kind of the job field at a path (its last key: keys carry their unit, so it is one per key).

    Examples
    --------
    >>> field_unit("lines[0].parts[1].length_m"), field_unit("lines[0].to_port.line_end_dash")
    ('length_m', None)
    """
    return _UNITS.get(path.rsplit(".", 1)[-1])


def field_label(record: str, key: str) -> str:
    """The label of a field of a record of the job model, as the form shows it.

    Examples
    --------
    >>> field_label("hose", "length_m"), field_label("line", "overall_length_mm")
    ('Length', 'Overall assembly length')
    """
    return _LABELS[record][key]


#: How an item of each list is named in words, counting from 1.
_ITEM_WORDS = {"lines": "line", "parts": "part", "bends": "bend", "conditions": "operating point"}
_RECORD_WORDS = {"from_port": "the start port", "to_port": "the end port"}


def path_words(path: str, job=None) -> str:
    """A field path in words, as the form labels it, counting from 1: "Bore of part 2 of line 1".

    ``job`` (the job the path is in) tells which kind a part is; without it a part's field is labelled from the
    first kind that has it.

    Examples
    --------
    >>> path_words("lines[0].parts[1].bends[0].radius_mm")
    'Centre-line radius of bend 1 of part 2 of line 1'
    >>> path_words("lines[2].to_port.line_end_dash"), path_words("pump.relief_bar")
    ('Line end size (dash) of the end port of line 3', 'Relief setting')
    >>> path_words("pump.flow_table_rpm_lpm[2][1]")
    'Delivered flow in row 3 of Flow table (pump speed, delivered flow)'
    """
    from .edits import parse_path  # same layer: the path syntax is the edits'
    spec, value, where, label = JOB, job, [], None
    try:
        steps = parse_path(path)
    except ValueError:  # a key no field has (named printably by the validator): the path is all there is
        return path
    for k, step in enumerate(steps):
        if isinstance(step, int) and isinstance(spec, Field) and spec.columns:  # a table's row, then its column
            row = f"row {step + 1} of {spec.label}"
            column = steps[k + 1] if k + 1 < len(steps) else None
            if isinstance(column, int) and column < len(spec.columns):
                row = f"{spec.columns[column].label} in {row}"
            return " of ".join([row] + where[::-1])
        if isinstance(step, int):
            where.append(f"{_ITEM_WORDS.get(steps[k - 1], 'item')} {step + 1}")
            value = value[step] if isinstance(value, (list, tuple)) and step < len(value) else None
            spec = spec.item if isinstance(spec, ListOf) else spec
            if isinstance(spec, Variants):
                tag = value.get(spec.tag) if isinstance(value, dict) else None
                nxt = steps[k + 1] if k + 1 < len(steps) else None
                if nxt == spec.tag:
                    return " of ".join(["Kind"] + where[::-1])
                spec = spec.variants.get(tag) or next((r for r in spec.variants.values()
                                                       if any(f.key == nxt for f in r.fields)), spec)
            continue
        fields = {f.key: f for f in getattr(spec, "fields", ())}
        spec = fields.get(step)
        value = value.get(step) if isinstance(value, dict) else None
        if spec is None:
            return path
        if isinstance(spec, Record) and k + 1 < len(steps):
            if step in _RECORD_WORDS:  # other records (pump, gear, thermal, cooler): their fields' labels say it
                where.append(_RECORD_WORDS[step])
            continue
        label = spec.label
    return " of ".join([label or path] + where[::-1])


def describe_job() -> dict:
    """The job model as JSON: every field with label, unit kind, default, limits and help."""
    presets = fluid_presets()
    return {"version": JOB_VERSION, "job": JOB.describe(), "default_conditions": DEFAULT_CONDITIONS,
            "fluid_presets": list(FLUID_PRESETS),
            "fluid_preset_values": {k: {f: v for f, v in presets[k].items() if f not in ("name", "source")}
                                    for k in FLUID_PRESETS}}
