"""The calculation sheet of cases with layers, a gas or trapped air, read
back with pypdf: the inputs list each case's layers (bottom up: liquid,
density, source, top level), its gas pressure, pockets assumption and
atmospheric pressure; the results give each layer's volume and weight and
each pocket (lip, sealed air, interface, air pressure); the method states
the layered and trapped-air laws (section format v3's formulas); the chart
shows both pocket assumptions.

Every number is compared with core's own solution of the case; Boyle's law
for the sealed volume, (p_atm + p_gas) V0 = (p_atm + p(z_i)) V(z_i), is the
spec's (and any physics text's, e.g. Halliday, Resnick & Walker, ideal gas
at constant temperature).
"""

import os

os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")

import datetime
import io
import re

import pytest

pypdf = pytest.importorskip("pypdf")

from wetline.app.render.level_chart import chart_series
from wetline.app.render.sheet import report_pdf_bytes
from wetline.core.numbers import format_number
from wetline.core.section_file import read_design

DATE = datetime.date(2026, 1, 2)


def _text(design):
    pdf = report_pdf_bytes(design, date=DATE)
    reader = pypdf.PdfReader(io.BytesIO(pdf))
    return re.sub(r"\s+", " ", " ".join(p.extract_text() for p in reader.pages))


@pytest.fixture(scope="module")
def grease():
    from wetline.samples import __file__ as where

    design = read_design(os.path.join(os.path.dirname(where), "grease_trap.section.json"))
    return design, _text(design)


@pytest.fixture(scope="module")
def lip():
    from wetline.samples import __file__ as where

    design = read_design(os.path.join(os.path.dirname(where), "chamber_with_lip.section.json"))
    return design, _text(design)


@pytest.mark.slow
def test_inputs_list_each_cases_layers_gas_and_air(grease):
    design, text = grease
    assert "Layers, gas and air of the cases" in text
    r = design.resolve(design.names[0])
    fat, sewage = r.liquids[1], r.liquids[0]
    # Bottom up: layer 1 sewage with its density, source and top; layer 2 fat.
    i = text.index("Layers, gas and air of the cases")
    block = text[i:i + 3000]
    first = block.index("raw sewage 1010")
    assert block.index("fats, oils and grease 900") > first
    assert sewage.source.split()[0] in block and "top at 1.85 m" in block
    assert "top at 1.5 m" in block  # the second case's thicker grease
    assert "vented (every pool at the level)" in block and "101.3 kPa" in block
    assert fat.density == 900


@pytest.mark.slow
def test_results_give_each_layers_volume_and_weight(grease):
    design, text = grease
    solved = design.solve(design.names[0]).solution
    for ly in solved.layers:
        row = (f"{ly.name} {format_number(ly.bottom)} {format_number(ly.top)} "
               f"{format_number(ly.volume)} {format_number(ly.weight / 1e3)}")
        assert row in text, row
    # Hand value: fat 0.15 m over the 2.5 m width, 900 kg/m3 (per m run).
    fat = solved.layers[1]
    assert fat.volume == pytest.approx(2.5 * 0.15, rel=1e-12)
    assert fat.weight == pytest.approx(900 * design.case.gravity * 0.375, rel=1e-12)
    assert "Hydrostatics of liquids at rest (one, or immiscible layers)" in text
    assert "p(z) = p gas + g ∫" in text or "ρ(s) ds" in text


@pytest.mark.slow
def test_pockets_listed_and_the_trapped_law_stated(lip):
    design, text = lip
    sc = design.solve(design.names[1])  # riser full, air trapped under the roof
    sol = sc.solution
    (pk,) = sol.pockets
    atm, gas = sol.atmospheric_pressure, sol.gas_pressure
    v0 = (atm + pk.air_pressure) * pk.air_volume / (atm + gas)
    row = (f"1 {format_number(pk.sealed_at)} {format_number(v0)} "
           f"{format_number(pk.interface)} {format_number(pk.air_volume)} "
           f"{format_number(pk.air_pressure / 1e3)}")
    assert row in text, row
    # Before sealing the air stood at the lip: V0 is the cavity's volume
    # above it in the pocket (the roof's region between the lip and roof).
    assert v0 > pk.air_volume > 0
    assert "trapped: compressed by the rising liquid (Boyle's law)" in text
    assert "Boyle's law, isothermal" in text


def test_chart_of_a_case_with_pockets_shows_both_assumptions():
    from wetline.samples import __file__ as where

    design = read_design(os.path.join(os.path.dirname(where), "chamber_with_lip.section.json"))
    case = design.resolve(design.names[0]).as_case()  # vented, but air can be trapped
    _, series, _ = chart_series(case, steps=41)
    labels = [label for _, label, *_ in series]
    assert "roof (down)" in labels and "roof (down), air trapped" in labels
    # The trapped curve is core's trapped table, in kN/m.
    tables = design.resolve(design.names[0]).level_tables(41)
    k = labels.index("roof (down), air trapped")
    assert series[k][-1] == pytest.approx(tables[1].part_down["roof"] / 1e3, rel=1e-12)
