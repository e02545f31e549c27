"""Write the bundled sample sections (sample_sections/*.section.json).

Invented design cases, made from the parametric templates so their shapes
stay in step with the GUI's. Run from the repository root:

    python tools/make_samples.py
"""

from decimal import Decimal
from pathlib import Path

from wetline.core.case import Case
from wetline.core.liquids import fresh_water, listed_liquid, seawater
from wetline.core.section_file import write_design, write_section_file
from wetline.core.templates import TEMPLATES

OUT = Path(__file__).resolve().parent.parent / "sample_sections"


def ft(v):
    """Feet to metres, correctly rounded (as reading a file in ft does)."""
    return float(Decimal(str(v)) * Decimal("0.3048"))


# file stem, template, dimensions [m], name, liquid, fill level [m], file unit;
# plane sections are 1 m wide (results per metre run) except the one in feet,
# which is 1 ft wide (results per foot run).
SAMPLES = [
    ("open_tank", "open_tank", dict(tank_width=6.0, height=3.2),
     "Settled-water holding tank, filter block", fresh_water(12.0), 2.8, "m"),
    ("flared_hopper", "flared_hopper",
     dict(top_width=3.6, outlet_width=0.45, hopper_height=2.2, upright_height=1.0),
     "Wash-water hopper over the backwash outlet gate", fresh_water(15.0), 3.0, "mm"),
    ("chamber_under_riser", "chamber_under_riser",
     dict(chamber_width=5.0, chamber_height=1.8, riser_width=0.9, riser_height=4.2),
     "Storm overflow chamber under an inspection riser", fresh_water(10.0), 5.4, "m"),
    ("sump_with_lid", "sump_with_lid",
     dict(well_width=2.4, well_depth=1.6, shaft_width=1.9, shaft_height=1.2),
     "Pump sump, inlet works north bay", fresh_water(20.0), 2.2, "m"),
    ("closed_tank", "closed_tank", dict(tank_width=3.0, height=2.0),
     "Break-pressure chamber under a header-tank standpipe", fresh_water(10.0), 4.5, "m"),
    ("cone_hopper", "cone_hopper",
     dict(radius=1.2, outlet_radius=0.15, cone_height=1.6, shell_height=2.4),
     "Ferric dosing tank, cone-bottomed", listed_liquid("ferric chloride 40 %"), 3.5, "m"),
    ("seawater_intake_bay", "sump_with_lid",
     dict(well_width=ft(14), well_depth=ft(10), shaft_width=ft(9), shaft_height=ft(8)),
     "Seawater intake bay under a pump deck", seawater(10.0, 35.0), ft(14), "ft"),
]


# Design samples (section format v3): the template's structure, ground, load
# cases and roof resistance at its default dimensions; file stem, template,
# name. Plane sections 1 m wide, in metres.
DESIGN_SAMPLES = [
    ("buried_wet_well", "buried_wet_well", "Buried wet well, village pumping station"),
    ("buried_chamber", "buried_chamber", "Buried storm chamber under a manhole riser"),
    ("grease_trap", "grease_trap", "Grease trap at a food plant, kitchen drain line"),
    ("chamber_with_lip", "chamber_with_lip",
     "Closed storage chamber under an inspection riser, downstand lip"),
]


def main():
    OUT.mkdir(exist_ok=True)
    for stem, key, dims, name, liquid, level, unit in SAMPLES:
        width = ft(1) if unit == "ft" else 1.0
        section = TEMPLATES[key].build(name=name, width=width, **dims)
        case = Case(section=section, liquid=liquid, fill_level=level, length_unit=unit)
        path = OUT / f"{stem}.section.json"
        write_section_file(case, path)
        print("wrote", path.relative_to(OUT.parent))
    for stem, key, name in DESIGN_SAMPLES:
        path = OUT / f"{stem}.section.json"
        write_design(TEMPLATES[key].design(name=name), path)
        print("wrote", path.relative_to(OUT.parent))


if __name__ == "__main__":
    main()
