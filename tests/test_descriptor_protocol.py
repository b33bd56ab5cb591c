"""The contract every descriptor module keeps (DEVELOPERS.md, "The
descriptor-module protocol"): values for exactly its own columns, never an
exception, and no empty value without a note that says why. Checked on every
ion of the library paired with a simple counter-ion (a property of our own
code: no reference values)."""
from __future__ import annotations

import math

import pytest

from ionicity.scorer.columns import DESCRIPTOR_MODULES, descriptor_modules
from ionicity.scorer.ion_library import ion_library, monatomic_ion
from ionicity.scorer.model import Decomposition, IonTerm


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
