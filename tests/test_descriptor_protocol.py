"""The contract every descriptor module keeps (DEVELOPERS.md, "The
descriptor-module protocol"): values for exactly its own columns, never an
exception, and no empty value without a note that says why. Checked on every
ion of the library paired with a simple counter-ion (a property of our own
code: no reference values); and on a few salts every method applies to, where
an empty value is a failure whatever its note says."""
from __future__ import annotations

import math

import pytest

from ionicity.scorer.caching import clear_all
from ionicity.scorer.columns import DESCRIPTOR_MODULES, descriptor_modules
from ionicity.scorer.ion_library import ion_library, monatomic_ion
from ionicity.scorer.model import Decomposition, IonTerm

from _calls import python_calls


def _library_salts():
    for ion in ion_library():
        if ion.charge > 0:
            yield ion.ion_id, Decomposition(
                cations=(IonTerm(ion, 1),), anions=(IonTerm(monatomic_ion("Cl", -1), ion.charge),),
                substance_class="ionic_salt",
            )
        else:
            yield ion.ion_id, Decomposition(
                cations=(IonTerm(monatomic_ion("Na", 1), -ion.charge),), anions=(IonTerm(ion, 1),),
                substance_class="ionic_salt",
            )


@pytest.mark.parametrize("module", descriptor_modules(), ids=DESCRIPTOR_MODULES)
def test_every_library_ion_gets_values_or_a_note(module):
    names = {c.name for c in module.COLUMNS}
    for ion_id, dec in _library_salts():
        values, notes = module.describe(dec)
        assert set(values) == names, ion_id
        gaps = [k for k, v in values.items() if v is None or (isinstance(v, float) and math.isnan(v))]
        assert not gaps or notes, (ion_id, gaps)


@pytest.mark.parametrize("module", descriptor_modules(), ids=DESCRIPTOR_MODULES)
def test_explain_gives_lines_for_every_library_ion(module):
    for ion_id, dec in _library_salts():
        lines = module.explain(dec)
        assert lines and all(isinstance(line, str) for line in lines), ion_id


# Salts every method of every module applies to: binary salts of monatomic ions
# with a tabulated structure type, Pauling electronegativities, Shannon radii,
# Tessman-Kahn-Shockley polarisabilities and Pearson classes. An empty value
# here is a regression, whatever note comes with it.
FULLY_COVERED = {
    "NaCl": (("Na", 1, 1), ("Cl", -1, 1)),
    "KF": (("K", 1, 1), ("F", -1, 1)),
    "MgO": (("Mg", 2, 1), ("O", -2, 1)),
    "CaF2": (("Ca", 2, 1), ("F", -1, 2)),
}


def _binary(spec) -> Decomposition:
    (m, zm, nm), (x, zx, nx) = spec
    return Decomposition(
        cations=(IonTerm(monatomic_ion(m, zm), nm),), anions=(IonTerm(monatomic_ion(x, zx), nx),),
        substance_class="ionic_salt",
    )


@pytest.mark.parametrize("name", sorted(FULLY_COVERED))
@pytest.mark.parametrize("module", descriptor_modules(), ids=DESCRIPTOR_MODULES)
def test_no_empty_value_where_every_method_applies(module, name):
    values, notes = module.describe(_binary(FULLY_COVERED[name]))
    empty = [k for k, v in values.items() if v is None or (isinstance(v, float) and math.isnan(v))]
    # Born-Mayer-Huggins needs Mayer's dispersion coefficients, published for the alkali halides
    # only; the thermochemical cycle is built for the Ag, Cu(I) and Tl(I) halides only.
    by_definition = {"lattice_energy_cycle_kJ_mol"}
    if name in ("MgO", "CaF2"):
        by_definition.add("lattice_energy_born_mayer_huggins_kJ_mol")
    if getattr(module, "GROUP", "") == "water":
        # an insoluble salt has no solution pH (MgO, CaF2); a basic solution (KF) carries the water caution
        by_definition.add("solution_ph")
        notes = [n for n in notes if n != module.WATER_CAUTION and not n.startswith("solution_ph empty: insoluble")]
    empty = [k for k in empty if k not in by_definition]
    assert not empty, (name, empty, notes)
    assert not notes, (name, notes)


@pytest.mark.parametrize("module", descriptor_modules(), ids=DESCRIPTOR_MODULES)
def test_a_result_is_computed_once_per_decomposition(module):
    # counted in Python calls, not seconds: a repeat costs a cache lookup and the
    # views, far less than the analysis
    dec = _binary(FULLY_COVERED["CaF2"])
    clear_all()  # the first call does the work
    first, calls_first = python_calls(module.describe, dec)
    again, calls_again = python_calls(module.describe, dec)
    assert again == first
    assert calls_again <= 12 and calls_first >= 4 * calls_again, (calls_first, calls_again)


@pytest.mark.parametrize("module", descriptor_modules(), ids=DESCRIPTOR_MODULES)
def test_values_notes_and_explain_are_views_of_one_result(module):
    dec = _binary(FULLY_COVERED["NaCl"])
    result = module.analyse(dec)
    values, notes = module.describe(dec)
    assert values == {c.name: getattr(result, c.name) for c in module.COLUMNS}
    assert notes == list(result.notes)
    explained = "\n".join(module.explain(dec))
    assert all(step in explained for step in result.steps)


def test_an_exception_becomes_a_note_not_a_crash():
    for module in descriptor_modules():
        values, notes = module.describe(object())  # not a decomposition at all
        assert set(values) == {c.name for c in module.COLUMNS}
        assert len(notes) == 1 and "not computed" in notes[0] and "AttributeError" in notes[0], notes
