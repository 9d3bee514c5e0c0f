"""The result declaration: every key of an ``evaluate`` result, with its kind, unit, label and help.

Declared once, in the style of the job model. The unit conversion at the edges (numbers
by their unit, the figures inside sentences), the text report and the page's result
tables read it; ``python -m calc describe --result`` prints it; a test fails on any
result key it lacks.

Kinds:

* ``number``: a float in the engine's unit (``unit`` is a key of the unit table);
* ``count``: a whole number (an index counts from 0 in the engine's lists);
* ``flag``: true or false;
* ``text``: words that are never converted: the user's own names, table names, codes;
* ``sentence``: the engine's own words with figures in engine units (converted at the edges);
* ``verdict``: 'ok', 'caution' or 'fail';
* ``path``: a field path in the validator's syntax (``lines[0].parts[1].bore_mm``), indexing the user's
  own lists from 0;
* ``value``: a value for the job field at a path, in that field's unit of the job model (a number, text,
  or a list of parts): never converted here, the edges convert it by the job model;
* ``list``: a list, its items declared at ``key[]``;
* ``map``: an object, its keys declared below it.
"""
from __future__ import annotations

from dataclasses import dataclass

__all__ = ["KINDS", "VERDICTS", "Out", "RESULT", "describe_result", "result_fields", "field_at", "check",
           "worst_verdict"]

KINDS = ("number", "count", "flag", "text", "sentence", "verdict", "path", "value", "list", "map")
VERDICTS = ("ok", "caution", "fail")


@dataclass(frozen=True)
class Out:
    """One key of a result: a scalar, a map (``fields``) or a list (``item``)."""

    key: str
    kind: str
    label: str
    unit: str | None = None
    nullable: bool = False
    help: str = ""
    fields: tuple = ()
    item: "Out | None" = None


def num(key, unit, label, help="", nullable=False):
    return Out(key, "number", label, unit, nullable, help)


def cnt(key, label, help="", nullable=False):
    return Out(key, "count", label, "count", nullable, help)


def flag(key, label, help=""):
    return Out(key, "flag", label, None, False, help)


def text(key, label, help="", nullable=False):
    return Out(key, "text", label, None, nullable, help)


def sentence(key, label, help="", nullable=False):
    return Out(key, "sentence", label, None, nullable, help)


def rec(key, label, fields, help="", nullable=False):
    return Out(key, "map", label, None, nullable, help, tuple(fields))


def lst(key, label, item, help="", nullable=False):
    return Out(key, "list", label, None, nullable, help, (), item)


def check(name: str, verdict: str, message: str) -> dict:
    """A check of the result: ``{"check", "verdict", "message"}`` (see ``CHECK``).

    Examples
    --------
    >>> check("velocity", "ok", "within the band")
    {'check': 'velocity', 'verdict': 'ok', 'message': 'within the band'}
    """
    return {"check": name, "verdict": verdict, "message": message}


def worst_verdict(checks) -> str:
    """The worst verdict of a list of checks ('ok' for none).

    Examples
    --------
    >>> worst_verdict([check("a", "ok", ""), check("b", "caution", "")])
    'caution'
    """
    order = {v: i for i, v in enumerate(VERDICTS)}
    return max((c["verdict"] for c in checks), key=order.__getitem__, default="ok")


EDIT = (Out("path", "path", "Field", help="The job field to set, in the user's own lists from 0."),
        Out("value", "value", "Value", help="The value to set it to, in the field's unit of the job model."))
CHECK = (text("check", "Check", "What is checked (velocity, pressure, burst, ...)."),
         Out("verdict", "verdict", "Verdict", help="ok, caution or fail."),
         sentence("message", "Finding", "What was found and, where something does not pass, what to change."),
         rec("fix", "Fix", EDIT + (text("label", "Field", "The field in words, counting from 1: 'Length of part 2'."),),
             "The edit that carries out the advice, where one field of the job does; null otherwise. Applying "
             "every fix of a result once gives a job whose result has no fix on the same fields.", nullable=True))
CHECKS = lst("checks", "Checks", rec("", "Check", CHECK))
#: Checks that never carry a fix (the fluid temperature's: the advice there is a cooler or a duty cycle).
PLAIN_CHECKS = lst("checks", "Checks", rec("", "Check", CHECK[:3]))

# -- per operating point ---------------------------------------------------------------------
PART_FLOW = (
    cnt("index", "Place in the line", "Position in the line as built (port adapters included), from 0."),
    cnt("job_part", "Part", "Position in the user's own parts list, from 0; null for a planned adapter.", True),
    text("adapter", "Adapter", "For an adapter the port plan added: its port and name.", True),
    text("kind", "Kind", "hose, tube, fitting, device, entrance or exit."),
    num("velocity_m_s", "speed_m_s", "Velocity", "Mean velocity in the part's bore."),
    num("reynolds", "dimensionless", "Reynolds number", "Reynolds number in the part's bore; 0 without flow."),
    text("regime", "Regime", "laminar, transitional (Re 2000-4000), turbulent, device or no flow."),
    num("friction_factor", "dimensionless", "Darcy friction factor"),
    num("k_minor", "dimensionless", "Minor-loss coefficient", "Sum of the part's K on its own velocity head."),
    num("pressure_drop_bar", "pressure_bar", "Pressure drop", "Drop across the part, elevation included."),
    num("friction_bar", "pressure_bar", "Friction drop"),
    num("minor_bar", "pressure_bar", "Minor-loss drop"),
    num("transition_bar", "pressure_bar", "Bore-change drop", "Loss of the change of bore at the part's inlet."),
    num("elevation_bar", "pressure_bar", "Elevation drop"),
    num("temp_rise_c", "temp_diff_c", "Temperature rise", "Throttling heat, dp / (rho cp), elevation excluded."),
)
LINE_FLOW = (
    cnt("index", "Line", "Position in the user's list of lines, from 0."),
    text("name", "Line name", "The user's name, or 'line N'."),
    text("role", "Role", "pressure, return or feed."),
    num("flow_lpm", "flow_lpm", "Flow"),
    num("velocity_max_m_s", "speed_m_s", "Highest velocity", "Fastest part of the line (fittings included)."),
    num("reynolds_min", "dimensionless", "Lowest Reynolds number"),
    num("reynolds_max", "dimensionless", "Highest Reynolds number"),
    num("pressure_drop_bar", "pressure_bar", "Pressure drop", "Inlet to outlet, elevation included."),
    num("inlet_bar", "pressure_bar", "Inlet pressure", "Gauge."),
    num("outlet_bar", "pressure_bar", "Outlet pressure", "Gauge."),
    num("temp_rise_c", "temp_diff_c", "Temperature rise", "Throttling heat along the line, elevation excluded."),
    flag("transitional", "Transitional flow", "Some part runs in the laminar-turbulent band."),
    lst("parts", "Parts", rec("", "Part", PART_FLOW)),
    lst("nodes", "Node pressures", rec("", "Node", (
        cnt("after_part", "After part", "Place in the line after which the pressure is taken; -1 at the inlet."),
        num("pressure_bar", "pressure_bar", "Pressure", "Gauge.")))),
)
REJECTED = (
    num("lines_w", "power_w", "By the lines"),
    num("reservoir_w", "power_w", "By the reservoir"),
    num("cooler_w", "power_w", "By the cooler"),
    num("total_w", "power_w", "Heat rejected"),
    lst("parts", "Per line part", rec("", "Part", (
        cnt("line", "Line", "Position in the user's list of lines, from 0."),
        cnt("part", "Place in the line", "Position in the line as built, from 0."),
        num("ua_w_k", "conductance_w_k", "Conductance to the air"),
        num("heat_w", "power_w", "Heat rejected"),
        num("surface_temp_c", "temp_c", "Outer surface temperature"),
        num("air_temp_c", "temp_c", "Air around the part", "The part's own air temperature where given, else the "
                                                            "under-hood air; a part in hotter air gains heat."),
        num("outside_mm", "length_mm", "Outside diameter")))),
)
CONDITION = (
    text("name", "Operating point", "The user's name of the operating point."),
    num("engine_rpm", "speed_rpm", "Engine speed"),
    num("fluid_temp_c", "temp_c", "Fluid temperature"),
    flag("full_lock", "Wheel at full lock"),
    num("viscosity_cst", "viscosity_cst", "Viscosity"),
    num("density_kg_m3", "density_kg_m3", "Density"),
    num("pump_geometric_lpm", "flow_lpm", "Pump geometric flow", "Displacement x pump speed."),
    num("pump_flow_lpm", "flow_lpm", "Pump flow", "Delivered, after the flow control."),
    num("pump_flow_uncapped_lpm", "flow_lpm", "Pump flow before the flow control"),
    flag("flow_control_limiting", "Flow control limiting"),
    num("circuit_flow_lpm", "flow_lpm", "Circuit flow", "Flow through the lines (less what crosses the relief, "
                                                             "and only what the feed line passes when starved)."),
    num("demand_flow_lpm", "flow_lpm", "Circuit flow wanted", "The circuit flow if the feed line starved nothing."),
    num("relief_flow_lpm", "flow_lpm", "Flow over the relief"),
    flag("relief_open", "Relief valve open"),
    num("circuit_need_bar", "pressure_bar", "Pressure needed at neutral", "Pump outlet pressure the circuit needs "
                                                                          "for the pump's whole flow at neutral."),
    num("pump_outlet_bar", "pressure_bar", "Pump outlet pressure", "Gauge."),
    num("metering_drop_bar", "pressure_bar", "Metering drop", "Drop across the flow-control valve's orifice."),
    num("pump_internal_bar", "pressure_bar", "Pressure the pump works against", "Outlet plus the metering drop."),
    num("gear_drop_bar", "pressure_bar", "Gear valve drop"),
    num("gear_outlet_bar", "pressure_bar", "Gear outlet pressure", "Gauge."),
    num("pump_inlet_bar", "pressure_bar", "Pump inlet pressure", "Gauge; never below a vacuum."),
    flag("has_feed_line", "Feed line listed"),
    lst("lines", "Lines", rec("", "Line", LINE_FLOW)),
    flag("pump_starved", "Pump starved", "The feed line cannot pass the flow with the inlet above its limit."),
    num("feed_limit_flow_lpm", "flow_lpm", "Flow the feed line passes at the inlet limit", "Null unless starved.", True),
    num("heat_w", "power_w", "Heat generated", "Hydraulic heat plus the pump's mechanical losses."),
    num("heat_hydraulic_w", "power_w", "Hydraulic heat", "Geometric flow x the pump's pressure rise."),
    num("heat_pump_loss_w", "power_w", "Mechanical losses", "Friction on top of the hydraulic input (with an "
                                                            "overall efficiency given)."),
    rec("heat_detail", "Heat generated, by where it arises", (
        num("leakage_w", "power_w", "Internal leakage"),
        num("bypass_w", "power_w", "Flow control and relief", "Flow the flow control recirculates or the relief "
                                                              "passes."),
        num("circuit_w", "power_w", "Circuit", "Metering orifice, lines, gear and feed line."),
        num("mechanical_w", "power_w", "Mechanical losses"))),
    num("heat_rejected_w", "power_w", "Heat rejected", "At this point's own temperature; negative when the "
                                                       "air warms the fluid."),
    rec("heat_rejected_detail", "Heat rejected, by surface", REJECTED),
)

# -- per line ------------------------------------------------------------------------------
ADAPTER = (
    sentence("name", "Adapter", "What it joins: the port's thread and seal to the line end's family and size."),
    rec("from", "Port side", (text("thread", "Thread"), text("seal", "Seal"), text("gender", "Gender"))),
    rec("to", "Line side", (text("family", "End family"), text("size", "Size"), text("thread", "Thread", nullable=True),
                            text("seal", "Seal"), text("gender", "Gender"))),
    num("working_bar", "pressure_bar", "Working pressure", "Lower of its two ends' typical ratings; null when "
                                                           "the tables hold none.", True),
    num("bore_mm", "length_mm", "Bore", "Smaller of its two ends' typical bores."),
    text("family", "Rated as family", "The end family whose rating is the adapter's.", True),
    cnt("dash", "Rated as size", "Dash size of that end.", True),
    text("source", "Source", "Where the rating and bore come from."),
)
PORT_PLAN = (
    flag("ok", "Seals", "Whether the joint can be made to seal."),
    lst("adapters", "Adapters", rec("", "Adapter", ADAPTER), "Empty when the line end fits the port directly."),
    sentence("message", "Plan", "The plan in words, or why the joint cannot seal."),
)
LINE_PART = (
    cnt("index", "Place in the line", "Position in the line as built (port adapters included), from 0."),
    cnt("job_part", "Part", "Position in the user's own parts list, from 0; null for a planned adapter.", True),
    text("adapter", "Adapter", "For an adapter the port plan added: the end it sits at and its name.", True),
    sentence("label", "Part", "The part in words, as every message names it: 'part 2 (hose SAE 100R2AT -6)', "
                              "counting from 1 in the user's list, or 'the adapter at the pump end (...)'."),
    text("kind", "Kind", "hose, tube, fitting, device, entrance or exit."),
    num("size_mm", "length_mm", "Size", "The part's size: a tube's outside diameter, otherwise its bore; null "
                                       "for a device.", True),
    cnt("dash", "Dash size", "In sixteenths of an inch: a hose's own, or a fitting's in a family sized so; "
                             "otherwise the nearest to the part's size. Null for a device.", True),
    flag("dash_exact", "On a dash size", "The part's own dash size, or a size within 0.15/16 in of that dash "
                                         "size."),
)
PART_RATING = (
    cnt("index", "Place in the line", "Position in the line as built (port adapters included), from 0."),
    text("kind", "Kind"),
    sentence("label", "Part", "The part in words, as the messages name it."),
    sentence("description", "Part", "The part in words (class and size, or bore)."),
    num("working_bar", "pressure_bar", "Working pressure", "Null when no rating is known.", True),
    num("burst_bar", "pressure_bar", "Burst pressure", nullable=True),
    num("design_factor", "ratio", "Design factor (burst : working)"),
    num("max_temp_c", "temp_c", "Highest temperature", nullable=True),
    num("min_temp_c", "temp_c", "Lowest temperature", nullable=True),
    num("min_bend_radius_mm", "length_mm", "Minimum bend radius", nullable=True),
    text("source", "Source of the rating", nullable=True),
    lst("notes", "Notes", sentence("", "Note")),
    num("barlow_burst_bar", "pressure_bar", "Burst by Barlow", "Tubes only."),
    num("lame_burst_bar", "pressure_bar", "Burst by Lame", "Tubes only."),
    num("tensile_mpa", "stress_mpa", "Tensile strength used", "Tubes only (derated where the table says)."),
)
WALL_POINT = (
    text("name", "Operating point"),
    num("fluid_temp_c", "temp_c", "Fluid temperature"),
    num("air_temp_c", "temp_c", "Air around the part"),
    flag("flow", "Fluid flowing", "False without flow through the line (full lock): both surfaces are then taken "
                                  "at the hotter of the fluid and the air (heat soak, conservative)."),
    num("inner_c", "temp_c", "Inner surface of the wall"),
    num("outer_c", "temp_c", "Outer surface of the wall", "Inside film, wall and outside film in series; radiation "
                                                          "from a hot surface nearby not modelled (it would make "
                                                          "the wall hotter)."),
)
WALL = (
    cnt("index", "Place in the line", "Position in the line as built (port adapters included), from 0."),
    cnt("job_part", "Part", "Position in the user's own parts list, from 0.", True),
    sentence("label", "Part", "The part in words, as the messages name it."),
    text("kind", "Kind", "hose or tube."),
    num("local_air_temp_c", "temp_c", "Air temperature around this part", "The part's own, near a heat source; "
                                                                         "null: the job's under-hood air.", True),
    num("air_temp_c", "temp_c", "Air around the part", "The one its heat exchange and wall estimate use."),
    num("hottest_c", "temp_c", "Hottest point of the wall", "Over the operating points; a lower bound near a hot "
                                                             "surface (radiation not modelled)."),
    text("hottest_at", "Hottest at", "The operating point of the hottest wall."),
    text("hottest_surface", "Hottest surface", "outer (air hotter than the fluid), inner, or both (no flow: the "
                                                "whole wall at one temperature)."),
    num("limit_c", "temp_c", "Temperature limit", "The part's rating (the same as lines[].rating.parts[]).", True),
    text("limit_basis", "Limit rates", "fluid: a hose's rating is for the fluid temperature, so the higher of the "
                                       "fluid and the wall is compared; wall: a tube's metal temperature."),
    num("judged_c", "temp_c", "Temperature compared with the limit"),
    Out("verdict", "verdict", "Wall verdict", nullable=True,
        help="fail over the limit, caution within 10 K of it or with no limit known; null where the part has no "
             "air of its own and its wall runs no hotter than the fluid (the fluid-temperature check judges it)."),
    sentence("message", "Wall finding", "The 'wall temperature' check's finding; null with no verdict.", True),
    lst("points", "Per operating point", rec("", "Point", WALL_POINT)),
)
ROUTE = (
    num("length_mm", "length_mm", "Route length", "Polyline through the measured points."),
    num("straight_mm", "length_mm", "End to end"),
    num("length_filleted_mm", "length_mm", "Shortest smooth path", "Every corner rounded at its largest radius."),
    lst("bends", "Bends the route forces", rec("", "Bend", (
        cnt("at_point", "At point", "Position in the measured points, from 0."),
        num("angle_deg", "angle_deg", "Angle turned"),
        num("max_radius_mm", "length_mm", "Largest radius the route leaves room for")))),
    num("tightest_radius_mm", "length_mm", "Tightest forced radius", "Null for a straight route.", True),
    num("total_turn_deg", "angle_deg", "Total turn"),
    sentence("method", "Method"),
)
RATING = (
    num("working_bar", "pressure_bar", "Assembly working pressure", "The weakest rated part's.", True),
    num("burst_bar", "pressure_bar", "Assembly burst pressure", "The lowest known burst.", True),
    num("design_factor", "ratio", "Design factor (burst : working)"),
    num("required_bar", "pressure_bar", "Must hold"),
    sentence("required_basis", "Basis of the pressure to hold"),
    num("margin", "ratio", "Working margin (working / must hold)", "Null near atmospheric or when unrated.", True),
    num("burst_margin", "ratio", "Burst margin (burst / must hold)", nullable=True),
    num("proof_test_bar", "pressure_bar", "Proof-test pressure", "2 x the assembly's working pressure (common "
                                                                 "practice); null when unrated.", True),
    rec("weakest_part", "Weakest part", (
        cnt("index", "Place in the line"), text("kind", "Kind"), sentence("description", "Part"),
        sentence("label", "Part in words"), num("working_bar", "pressure_bar", "Working pressure")), nullable=True),
    lst("unrated_parts", "Parts with no rating", cnt("", "Place in the line")),
    num("temp_max_c", "temp_c", "Highest fluid temperature"),
    num("temp_min_c", "temp_c", "Lowest fluid temperature"),
    num("pressure_min_bar", "pressure_bar", "Lowest pressure in the line", "Gauge."),
    num("dp_budget_bar", "pressure_bar", "Pressure-drop budget, warm", "The line's own, or its role's default "
                                                                       "(common practice); null for none.", True),
    num("dp_budget_cold_bar", "pressure_bar", "Pressure-drop budget at cold start", nullable=True),
    lst("parts", "Part ratings", rec("", "Part rating", PART_RATING)),
)
ASSEMBLY = (
    cnt("hose_part", "Assembly hose", "Its position in the user's parts list, from 0; null when the line has no "
                                      "single hose assembly.", True),
    text("length_source", "Cut length from", "route (the measured points plus slack), overall (the overall length), "
                                             "typed (the hose's own length) or none."),
    num("hose_cut_mm", "length_mm", "Cut length of the hose", nullable=True),
    num("typed_mm", "length_mm", "Length typed on the hose", nullable=True),
    num("cutoff_mm", "length_mm", "Cut-off allowances", "What the end fittings add beyond the cut hose."),
    num("overall_mm", "length_mm", "Assembly end to end", nullable=True),
    num("slack_mm", "length_mm", "Slack over the route", "Null without route points.", True),
    num("slack_needed_mm", "length_mm", "Slack needed", "Shrink under pressure plus engine movement.", True),
    num("overall_needed_mm", "length_mm", "Shortest overall length", "With route points: what holds the slack.",
        True),
    lst("bends", "Bends of the hose", rec("", "Bend", (num("angle_deg", "angle_deg", "Angle"),
                                                        num("radius_mm", "length_mm", "Centre-line radius")))),
    flag("bends_from_route", "Bends from the route", "The route points give the hose's bends (the ones the "
                                                      "hydraulics and the bend check use)."),
    flag("typed_bends_ignored", "Typed bends not used", "Bends typed on the hose while route points give them."),
    rec("route", "Route", ROUTE, "From the measured route points; null without them.", nullable=True),
)
POINT = lst("", "Point", num("", "length_mm", "Coordinate"), "x, y, z.")
SKETCH_BEND = (
    cnt("at_point", "At point", "Position in the measured points, from 0."),
    num("angle_deg", "angle_deg", "Angle turned"),
    num("radius_mm", "length_mm", "Radius", "The largest radius the route leaves room for at this corner: the "
                                            "one the hose takes."),
    lst("corner_mm", "Corner", num("", "length_mm", "Coordinate"), "The measured corner point, x, y, z."),
    lst("tangent_in_mm", "Bend starts", num("", "length_mm", "Coordinate"), "Where the arc leaves the incoming "
                                                                             "straight, x, y, z."),
    lst("tangent_out_mm", "Bend ends", num("", "length_mm", "Coordinate"), "Where the arc meets the outgoing "
                                                                            "straight, x, y, z."),
    Out("verdict", "verdict", "Verdict", help="fail: tighter than the minimum bend radius; caution: no minimum "
                                              "known."),
    sentence("message", "Bend", "The bend in words, with its radius and the minimum it is judged against."),
)
SKETCH = (
    num("movement_mm", "length_mm", "Engine movement", "Total travel of the end on the engine."),
    text("movement_axis", "Direction of engine movement", "x, y or z of the route points."),
    text("engine_end", "End on the engine", "start or end."),
    num("min_bend_radius_mm", "length_mm", "Minimum bend radius", "The largest of the line's hoses' and tubes' "
                                                                  "known minimum bend radii.", True),
    sentence("min_bend_radius_of", "Minimum bend radius of", "The part it belongs to.", True),
    Out("verdict", "verdict", "Verdict", help="The worst of the bends at every position."),
    lst("positions", "Positions", rec("", "Position", (
        text("name", "Position", "at rest, or the engine moved one way or the other."),
        num("offset_mm", "length_mm", "Moved by", "Signed, along the direction of engine movement."),
        lst("points_mm", "Route points", POINT, "The measured points, the engine end moved."),
        num("length_mm", "length_mm", "Route length"),
        lst("bends", "Bends", rec("", "Bend", SKETCH_BEND)))),
        "At rest, then with the end on the engine moved half the movement each way (none without movement)."),
)
CANDIDATE = (
    text("class", "Hose class"),
    cnt("dash", "Dash size"),
    num("bore_mm", "length_mm", "Bore"),
    text("label", "Candidate", "The class and size, and the line, counting from 1."),
    Out("verdict", "verdict", "Verdict", help="The verdict the line gets once the candidate's edits are applied."),
    lst("failed", "Failed checks", text("", "Check"), "The checks the line fails once it is applied."),
    cnt("cautions", "Cautions", "How many of its checks are cautions."),
    lst("cautioned", "Checks with a caution", text("", "Check"), "Their names, once each."),
    lst("reasons", "Why", sentence("", "Reason"), "The failed checks' findings, or else the cautions'."),
    num("velocity_max_m_s", "speed_m_s", "Highest velocity in the hose"),
    num("pressure_drop_bar", "pressure_bar", "Largest drop", "The line's largest drop with this hose, over the "
                                                             "operating points."),
    text("pressure_drop_at", "Largest drop at", "The operating point of that drop."),
    num("working_bar", "pressure_bar", "Assembly working pressure", "The weakest rated part's, as built.", True),
    num("hose_working_bar", "pressure_bar", "Hose working pressure"),
    num("min_bend_radius_mm", "length_mm", "Minimum bend radius"),
    cnt("light_rank", "Construction rank", "1 = lightest construction (textile braid) to 4 (two wire braids)."),
    text("source", "Source"),
    flag("current", "The line's own", "The line's hoses are already of this class and size."),
    sentence("note", "Note", "Larger than needed, where a smaller size of the class passes too.", True),
    lst("apply", "Edits", rec("", "Edit", EDIT), "Set each field in order to build the line with this hose: its "
                                                  "parts list (the hose, its end fittings re-sized) and any port "
                                                  "line-end size. Empty for the line's own."),
)
LINE = (
    cnt("index", "Line", "Position in the user's list of lines, from 0."),
    text("name", "Line name"),
    text("role", "Role"),
    Out("verdict", "verdict", "Verdict", help="The worst verdict of the line's checks."),
    num("pressure_drop_max_bar", "pressure_bar", "Largest drop", "The line's largest pressure drop over the "
                                                                  "operating points."),
    text("pressure_drop_max_at", "Largest drop at", "The operating point of the largest drop."),
    CHECKS,
    rec("ports", "Ports", (rec("from_port", "Start port", PORT_PLAN, "Null when the start port names no line end.",
                               nullable=True),
                           rec("to_port", "End port", PORT_PLAN, "Null when the end port names no line end.",
                               nullable=True))),
    lst("parts", "Parts as built", rec("", "Part", LINE_PART)),
    rec("assembly", "Hose assembly", ASSEMBLY, "The cut length, slack and bends, worked out once."),
    rec("rating", "Rating", RATING),
    lst("walls", "Wall temperatures", rec("", "Hose or tube", WALL), "Each hose and tube as built: its wall "
        "between the fluid and the air around it at every operating point, and its verdict near a heat source."),
    rec("sketch", "Route sketch", SKETCH, "The route drawn from the measured points; null without them.",
        nullable=True),
    lst("candidates", "Hose candidates", rec("", "Candidate", CANDIDATE),
        "Each tabulated hose class around its smallest size that passes, built and checked as a whole "
        "assembly; passing ones first."),
)

# -- thermal ---------------------------------------------------------------------------------
THERMAL = (
    num("limit_c", "temp_c", "Temperature limit"),
    sentence("limit_basis", "Basis of the limit"),
    num("target_c", "temp_c", "Target temperature", "The limit less the margin."),
    num("margin_c", "temp_diff_c", "Margin below the limit"),
    num("air_temp_c", "temp_c", "Under-hood air"),
    lst("method", "Method", sentence("", "Method")),
    lst("hose_wall_defaulted", "Hose walls not given", Out("", "path", "Field")),
    rec("steady", "Steady-temperature solve", (
        text("status", "Status", "converged, no heat, none below, not converged, failed or no duty cycle."),
        num("temp_c", "temp_c", "Temperature", nullable=True),
        cnt("iterations", "Evaluations"),
        sentence("message", "Message"))),
    num("steady_heat_w", "power_w", "Heat generated (duty-weighted)"),
    num("steady_rejected_w", "power_w", "Heat rejected (duty-weighted)"),
    lst("steady_duty", "Per operating point at the steady temperature", rec("", "Operating point", (
        text("name", "Operating point"), num("duty_percent", "percent", "Share of time"),
        num("heat_w", "power_w", "Heat generated"), num("heat_rejected_w", "power_w", "Heat rejected"),
        num("lines_w", "power_w", "By the lines"), num("reservoir_w", "power_w", "By the reservoir"),
        num("cooler_w", "power_w", "By the cooler")))),
    num("steady_temp_c", "temp_c", "Steady temperature", "Null when there is none.", True),
    rec("full_lock", "Full-lock hold", (
        sentence("condition", "Operating point used"),
        num("start_temp_c", "temp_c", "Starting temperature"),
        sentence("start_from", "Starting from"),
        num("heat_w", "power_w", "Heat at full lock"),
        num("pump_volume_l", "volume_l", "Fluid in the pump"),
        num("pump_heat_capacity_j_k", "heat_capacity_j_k", "Heat capacity of the pump and its fluid"),
        num("pump_rate_k_s", "temp_rate_k_s", "Warming rate in the pump"),
        num("volume_l", "volume_l", "Whole fluid volume"),
        num("heat_capacity_j_k", "heat_capacity_j_k", "Heat capacity of the whole fluid"),
        num("bulk_seconds_to_limit", "time_s", "Whole fluid, mixed: time to the limit", "Secondary; null when not "
                                                                                        "reached.", True),
        num("levels_off_c", "temp_c", "Whole fluid levels off near", nullable=True),
        sentence("message", "Whole fluid, mixed"))),
    num("full_lock_seconds_to_limit", "time_s", "Time at full lock to the limit", "The fluid in the pump; null "
                                                                                  "without heat.", True),
    lst("full_lock_curve", "Full-lock curve", rec("", "Point", (
        num("t_s", "time_s", "Time held"), num("pump_temp_c", "temp_c", "Fluid in the pump"),
        num("bulk_temp_c", "temp_c", "Whole fluid, mixed")))),
    num("cooler_needed_w_per_k", "conductance_w_k", "Cooler needed", "0: none needed; null: none can help.", True),
    num("cooler_needed_tube_m", "length_m", "Cooler tube needed", nullable=True),
    rec("cooler_tube", "Cooler tube used for the advice", (
        num("od_mm", "length_mm", "Outside diameter"), num("wall_mm", "length_mm", "Wall"),
        num("fins_per_inch", "count", "Fins per inch"),
        num("fin_od_mm", "length_mm", "Fin outside diameter", nullable=True))),
    sentence("cooler_message", "Cooler advice"),
    PLAIN_CHECKS,
    Out("verdict", "verdict", "Verdict"),
    sentence("message", "Finding"),
)

FLUID = (
    text("name", "Fluid"), text("preset", "Preset", nullable=True),
    num("visc_40c_cst", "viscosity_cst", "Viscosity at 40 C"), num("visc_100c_cst", "viscosity_cst", "Viscosity at 100 C"),
    num("density_15c_kg_m3", "density_kg_m3", "Density at 15 C"),
    num("specific_heat_j_kgk", "specific_heat_j_kgk", "Specific heat"),
    num("max_temp_c", "temp_c", "Fluid temperature limit"), text("source", "Source of the values"),
)
PUMP_CURVE = (
    num("flow_limit_lpm", "flow_lpm", "Flow-control setting", nullable=True, help="None when the pump's flow table "
                                                                                  "takes its place."),
    num("pulley_ratio", "ratio", "Pulley ratio used", "Pump speed over crank speed: as given, else from the two "
                                                       "pulley diameters, else 1."),
    lst("points", "Delivered flow against engine speed", rec("", "Point", (
        num("engine_rpm", "speed_rpm", "Engine speed"),
        num("delivered_lpm", "flow_lpm", "Delivered flow")))),
    lst("table", "Pump's flow table", rec("", "Row", (
        num("engine_rpm", "speed_rpm", "Engine speed", "The engine speed that turns the pump at the row's speed."),
        num("pump_rpm", "speed_rpm", "Pump speed"),
        num("table_lpm", "flow_lpm", "Flow in the table", "The row's flow as the table gives it; the delivered "
                                                          "flow is never more than the pump displaces."))),
        "Empty when the pump has no flow table."),
)

_LINES_USED = lst("lines", "Used on lines", cnt("", "Line", "Position in the user's list of lines, from 0."))
ORDER = (
    lst("hoses", "Hose", rec("", "Hose", (
        text("class", "Hose class", nullable=True), cnt("dash", "Dash size", nullable=True),
        num("bore_mm", "length_mm", "Bore"),
        num("total_mm", "length_mm", "Total length", "Cut lengths added up (assembly hoses at their worked-out "
                                                      "cut length)."),
        cnt("pieces", "Pieces"), _LINES_USED))),
    lst("tubes", "Rigid tube", rec("", "Tube", (
        text("material", "Material"), num("od_mm", "length_mm", "Outside diameter"),
        num("wall_mm", "length_mm", "Wall thickness"), num("total_mm", "length_mm", "Total length"),
        cnt("pieces", "Pieces"), _LINES_USED))),
    lst("fittings", "Fittings", rec("", "Fitting", (
        text("family", "Family", nullable=True), cnt("dash", "Size (dash)", nullable=True),
        text("shape", "Shape"), num("bore_mm", "length_mm", "Bore"), cnt("count", "Count"), _LINES_USED))),
    lst("adapters", "Adapters", rec("", "Adapter", (
        sentence("name", "Adapter"), cnt("count", "Count"), _LINES_USED)), "The adapters the port plans add."),
    lst("devices", "Coolers and series devices", rec("", "Device", (
        flag("is_cooler", "Is a cooler"), cnt("count", "Count"), _LINES_USED))),
)

RESULT = rec("", "Result", (
    flag("ok", "Computed"),
    text("job_name", "Job"),
    rec("fluid", "Fluid", FLUID),
    lst("conditions", "Operating points", rec("", "Operating point", CONDITION)),
    rec("circuit", "Pump, relief and gear", (
        Out("verdict", "verdict", "Verdict", help="The worst verdict of the circuit's checks."), CHECKS)),
    lst("lines", "Lines", rec("", "Line", LINE)),
    rec("thermal", "Fluid temperature", THERMAL),
    lst("warnings", "Warnings", rec("", "Warning", (Out("path", "path", "Field"),
                                                     text("label", "Field in words", "'Bore of part 2 of line 1'."),
                                                     sentence("message", "Warning")))),
    lst("methods", "Methods", sentence("", "Method")),
    rec("pump_curve", "Pump delivery", PUMP_CURVE, "For the plot of delivered flow against engine speed."),
    rec("order", "Order list", ORDER, "What to buy to build every line as built."),
))


def _walk(decl: Out, path: str, out: list) -> None:
    if path:
        out.append(decl if decl.key == path else Out(path, decl.kind, decl.label, decl.unit, decl.nullable,
                                                     decl.help, decl.fields, decl.item))
    if decl.kind == "map":
        for f in decl.fields:
            _walk(f, f"{path}.{f.key}" if path else f.key, out)
    elif decl.kind == "list":
        item = decl.item
        if item.kind == "map":
            for f in item.fields:
                _walk(f, f"{path}[].{f.key}", out)
        else:
            _walk(item, f"{path}[]", out)


def result_fields() -> list[Out]:
    """Every declared key as an ``Out`` whose ``key`` is its full path (``conditions[].lines[].flow_lpm``)."""
    out: list[Out] = []
    _walk(RESULT, "", out)
    return out


_BY_PATH: dict = {}


def field_at(path: str) -> Out | None:
    """The declaration of a result path, or None.

    Examples
    --------
    >>> field_at("conditions[].lines[].parts[].velocity_m_s").unit
    'speed_m_s'
    """
    if not _BY_PATH:
        _BY_PATH.update((f.key, f) for f in result_fields())
    return _BY_PATH.get(path)


def describe_result() -> list[dict]:
    """The result declaration as JSON rows ``{path, kind, unit, nullable, label, help}``.

    Examples
    --------
    >>> [r for r in describe_result() if r["path"] == "lines[].checks[].message"][0]["kind"]
    'sentence'
    """
    return [{"path": f.key, "kind": f.kind, "unit": f.unit, "nullable": f.nullable, "label": f.label,
             "help": f.help} for f in result_fields()]
