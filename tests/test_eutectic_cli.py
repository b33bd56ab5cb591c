"""``ionicity eutectic`` and ``ionicity score --aliases`` on the command line (in-process).

Published values quoted: LiCl-KCl eutectic 625 K at 58.8 mol% LiCl (Janz,
Molten Salts Handbook 1967, from memory; scorer/data/eutectics.csv).
"""
from __future__ import annotations

import csv
import os
import re

import pytest

from ionicity.pipelines import eutectic_cli as eutectic
from ionicity.pipelines.aliases import ENVIRONMENT_VARIABLE
from ionicity.pipelines.cli import main
from ionicity.pipelines.melting_cli import MissingExtraError
from ionicity.scorer.mixture import set_user_blends
from ionicity.scorer.record import score_formula


@pytest.fixture(autouse=True)
def _no_user_blends():
    yield
    # --aliases passes the names to worker processes through the environment: leave none behind
    os.environ.pop(ENVIRONMENT_VARIABLE, None)
    set_user_blends(())


def test_eutectic_licl_kcl_prints_composition_temperature_and_writes_a_plot(tmp_path, monkeypatch, capsys):
    pytest.importorskip("matplotlib")
    monkeypatch.chdir(tmp_path)
    assert main(["eutectic", "LiCl", "KCl"]) == 0
    out = capsys.readouterr().out
    m = re.search(r"estimated minimum liquidus: (\d+) K .* at ([0-9.]+) LiCl \+ ([0-9.]+) KCl", out)
    assert m, out
    temperature, x_licl = float(m.group(1)), float(m.group(2))
    assert abs(temperature - 625) / 625 < 0.10  # the published eutectic, within the validation target
    assert 0.5 < x_licl < 0.7
    assert "published: 625 K" in out and "corrosion of containers" in out
    plot = tmp_path / "eutectic_LiCl-KCl.png"
    assert plot.read_bytes()[:8] == b"\x89PNG\r\n\x1a\n"


def test_eutectic_svg_and_three_components(tmp_path, capsys):
    pytest.importorskip("matplotlib")
    path = tmp_path / "flinak.svg"
    assert main(["eutectic", "LiF", "NaF", "KF", "--plot", str(path)]) == 0
    assert "<svg" in path.read_text()[:400]
    assert "published: 727 K" in capsys.readouterr().out


def test_eutectic_without_matplotlib_is_exit_2_with_the_install_hint(monkeypatch, capsys):
    def missing(name):
        raise MissingExtraError(name)

    monkeypatch.setattr(eutectic, "require_extra", missing)
    assert main(["eutectic", "LiCl", "KCl"]) == 2
    err = capsys.readouterr().err
    assert 'pip install -e ".[melting]"' in err and len(err.strip().splitlines()) == 1


@pytest.mark.parametrize(
    "argv, words",
    [
        (["eutectic", "LiCl"], "two or three components"),
        (["eutectic", "LiCl", "Xx", "--no-plot"], "'Xx'"),
        (["eutectic", "LiCl", "CuCl2", "--no-plot"], "no melting point and enthalpy of fusion for 'CuCl2'"),
        (["eutectic", "LiCl", "KCl", "--plot", "x.pdf"], ".png or .svg"),
    ],
)
def test_eutectic_bad_input_is_exit_2(argv, words, tmp_path, monkeypatch, capsys):
    monkeypatch.chdir(tmp_path)
    assert main(argv) == 2
    assert words in capsys.readouterr().err


def test_deep_eutectic_reports_the_depression(capsys):
    assert main(["eutectic", "ChCl", "urea", "--no-plot"]) == 0
    out = capsys.readouterr().out
    assert "ideal line is the reference" in out and "below it" in out


def test_batch_ranks_the_pairs_of_ten_salts(tmp_path, capsys):
    salts = ["LiCl", "NaCl", "KCl", "LiF", "NaF", "KF", "NaNO3", "KNO3", "LiNO3", "MgCl2"]
    table = tmp_path / "salts.csv"
    table.write_text("name,formula\n" + "".join(f"salt {i},{s}\n" for i, s in enumerate(salts)))
    out = tmp_path / "pairs.csv"
    assert main(["eutectic", "--table", str(table), "-o", str(out)]) == 0
    rows = list(csv.DictReader(out.open()))
    assert len(rows) == 45 and all(r["status"] == "ok" for r in rows)
    temps = [float(r["eutectic_estimate_K"]) for r in rows]
    assert temps == sorted(temps)
    # the nitrates melt lowest, the fluorides highest (Janz 1967: every nitrate pair is below every fluoride pair)
    nitrates = {"NaNO3", "KNO3", "LiNO3"}
    assert {rows[0]["component_a"], rows[0]["component_b"]} <= nitrates
    assert not {rows[-1]["component_a"], rows[-1]["component_b"]} & nitrates
    assert main(["eutectic", "--table", str(table), "-o", str(out)]) == 2  # no silent replace


def test_batch_pairs_that_cannot_be_estimated_are_kept(tmp_path, capsys):
    table = tmp_path / "salts.csv"
    table.write_text("formula\nLiCl\nKCl\nCuCl2\n")
    assert main(["eutectic", "--table", str(table)]) == 0
    rows = list(csv.DictReader(capsys.readouterr().out.splitlines()))
    assert len(rows) == 3 and [r["status"] for r in rows] == ["ok", "error", "error"]


def test_score_with_aliases(tmp_path, capsys):
    aliases = tmp_path / "aliases.csv"
    aliases.write_text("name,mixture,source\nbath A,LiCl-KCl (50-50 mol%),invented\n")
    data = tmp_path / "in.csv"
    data.write_text("formula\nbath A\nNaCl\n")
    out = tmp_path / "out.csv"
    assert main(["score", str(data), "-o", str(out), "--aliases", str(aliases), "--quiet"]) == 0
    rows = list(csv.DictReader(out.open()))
    assert rows[0]["substance_class"] == "mixture" and rows[0]["mixture_mole_fractions"] == "0.5;0.5"
    assert rows[1]["substance_class"] == "ionic_salt"
    set_user_blends(())
    assert score_formula("bath A")["status"] == "error"


@pytest.mark.parametrize(
    "text, words",
    [
        ("nam,mix\na,b\n", "the header lacks name, mixture"),
        ("name,mixture\nNaCl,LiCl-KCl\n", "reads as a formula"),
        ("name,mixture\nfoo,LiCl\n", "is not mixture notation"),
        ("name,mixture\nfoo,LiCl-KCl 1:2:3\n", "3 proportions for 2 components"),
        ("name,mixture\nfoo,LiCl-KCl\nFOO,NaCl-KCl\n", "given again"),
        ("name,mixture\nfoo,\n", "must both be given"),
        ("name,mixture\n", "no names"),
    ],
)
def test_bad_aliases_file_is_exit_2_naming_the_problem(text, words, tmp_path, capsys):
    aliases = tmp_path / "aliases.csv"
    aliases.write_text(text)
    data = tmp_path / "in.csv"
    data.write_text("formula\nNaCl\n")
    assert main(["score", str(data), "-o", str(tmp_path / "o.csv"), "--aliases", str(aliases)]) == 2
    err = capsys.readouterr().err
    assert words in err and "aliases.csv" in err


def test_aliases_file_missing_or_not_utf8(tmp_path, capsys):
    data = tmp_path / "in.csv"
    data.write_text("formula\nNaCl\n")
    assert main(["score", str(data), "-o", str(tmp_path / "o.csv"), "--aliases", str(tmp_path / "none.csv")]) == 2
    assert "cannot read the file" in capsys.readouterr().err
    bad = tmp_path / "latin.csv"
    bad.write_bytes("name,mixture\nbain é,LiCl-KCl\n".encode("latin-1"))
    assert main(["score", str(data), "-o", str(tmp_path / "o.csv"), "--aliases", str(bad)]) == 2
    assert "not UTF-8" in capsys.readouterr().err


def test_explain_a_mixture_shows_every_component(capsys):
    assert main(["explain", "FLiNaK"]) == 0
    out = capsys.readouterr().out
    for name in ("component LiF", "component NaF", "component KF", "liquidus_estimate_K", "fusion: melts at"):
        assert name in out
    assert out.count("lattice_energy_vbt_kJ_mol") >= 3  # each component's own lattice energy


def test_eutectic_of_a_network_forming_salt_is_flagged(capsys):
    # ZnCl2 with KCl forms ZnCl4(2-) (K2ZnCl4; ACerS-NIST Phase Equilibria Diagrams, KCl-ZnCl2, from memory):
    # the simple-ion estimate is far below the measured eutectic, and the command says so, as the mixture rows do
    assert main(["eutectic", "ZnCl2", "KCl", "--no-plot"]) == 0
    out = capsys.readouterr().out
    assert "warning: liquidus estimate: ZnCl2 is not a simple-ion salt" in out
    assert main(["eutectic", "LiCl", "KCl", "--no-plot"]) == 0
    assert "not a simple-ion salt" not in capsys.readouterr().out
