"""The sheet's header and document control (core.case.ReportInfo): the
``report`` object of a section file, read and written (docs/section-format-v2.md)."""

import pytest

from wetline.core.case import CaseError, ReportInfo, Revision

FULL = {
    "project": "Inlet works upgrade", "job_reference": "C-0417",
    "prepared_by": "A. Designer", "calculation_reference": "C-0417-HYD-003",
    "revision": "B", "checked_by": "C. Checker", "approved_by": "D. Lead",
    "revisions": [
        {"revision": "A", "date": "2026-01-12", "description": "first issue",
         "prepared": "AD", "checked": "CC", "approved": "DL"},
        {"revision": "B", "date": "2026-02-03", "description": "lid level to the new survey",
         "prepared": "AD", "checked": "CC", "approved": "DL"}],
    "significant_figures": 5,
}


def test_the_report_object_round_trips_exactly():
    info = ReportInfo.from_dict(FULL)
    assert info.checked_by == "C. Checker" and info.approved_by == "D. Lead"
    assert info.revisions[1] == Revision("B", "2026-02-03", "lid level to the new survey",
                                         "AD", "CC", "DL")
    assert info.significant_figures == 5
    assert info.to_dict() == FULL
    assert ReportInfo.from_dict(info.to_dict()) == info


def test_an_older_report_object_still_reads():
    old = {"project": "Inlet works upgrade", "job_reference": "C-0417",
           "prepared_by": "design team"}
    info = ReportInfo.from_dict(old)
    assert info == ReportInfo("Inlet works upgrade", "C-0417", "design team")
    assert info.significant_figures == 4 and info.revisions == ()
    assert info.to_dict() == old
    assert ReportInfo().is_empty and ReportInfo().to_dict() == {}


def test_the_current_revision_is_the_last_row_unless_given():
    rows = (Revision("A"), Revision("B"))
    assert ReportInfo(revisions=rows).current_revision == "B"
    assert ReportInfo(revision="C", revisions=rows).current_revision == "C"
    assert ReportInfo().current_revision == ""
    assert not ReportInfo(significant_figures=5).is_empty


@pytest.mark.parametrize("data, message", [
    ({"checkd_by": "x"}, "report: unknown key 'checkd_by'"),
    ({"checked_by": 3}, "report.checked_by must be text"),
    ({"revisions": {}}, "report.revisions must be a list"),
    ({"revisions": ["A"]}, r"report.revisions\[0\] must be an object"),
    ({"revisions": [{}, {"dte": "2026"}]}, r"report.revisions\[1\]: unknown key 'dte'"),
    ({"revisions": [{"date": 2026}]}, r"report.revisions\[0\].date must be text"),
    ({"significant_figures": 9}, "report.significant_figures must be a whole number from 3 "
                                 "to 6, not 9"),
    ({"significant_figures": 4.5}, "must be a whole number"),
    ({"significant_figures": True}, "must be a whole number"),
    ([], "report must be an object"),
])
def test_bad_report_objects_are_refused_naming_the_key(data, message):
    with pytest.raises(CaseError, match=message):
        ReportInfo.from_dict(data)


def test_figures_given_as_a_whole_float_read_as_an_integer():
    assert ReportInfo.from_dict({"significant_figures": 5.0}).significant_figures == 5
