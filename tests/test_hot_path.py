"""The speed tricks of the batch path give what the plain path gives.

Each trick here has a plain counterpart written out in the test, and the two
are compared on varied inputs: the value_notes of the reference formulas
(tests/data/formula_cases.csv, sources per row there), of the invented demo
inventory (datasets/demo/inventory.csv) and of the benchmark's formulas; the
cache's numpy gather against pyarrow's own ``take``. No reference value is
asserted here: the reference is the plain computation itself (common practice
for a refactoring check).
"""
from __future__ import annotations

import csv
import functools
import random
import re

import numpy as np
import pyarrow as pa
import pytest

from ionicity.pipelines.bench import realistic_formulas
from ionicity.pipelines.formula_cache import FormulaCache
from ionicity.pipelines.pool import score_values
from ionicity.pipelines.scheduler import BatchScorer
from ionicity.scorer.columns import output_columns
from ionicity.scorer.note_codes import NOTE_CODES, _ION, _code, short_notes
from ionicity.scorer.record import score_formula


def _every_pattern(text: str | None) -> str | None:
    """short_notes without the literal-prefix filter: every pattern's substitution, in order."""
    if not text:
        return text
    for code, pattern, _ in NOTE_CODES:
        regex = re.compile(r"(?:^|(?<=; ))" + pattern.replace("{ion}", _ION) + r"(?=;|$)")
        text = regex.sub(_code(code), text)
    return text


def _sample_formulas() -> list[str]:
    cases = [r["formula"] for r in csv.DictReader(open("tests/data/formula_cases.csv", encoding="utf-8"))]
    demo = [r["formula"] for r in csv.DictReader(open("datasets/demo/inventory.csv", encoding="utf-8"))]
    return cases + demo + random.Random(3).sample(realistic_formulas(5000), 600)


def test_short_notes_filter_changes_no_cell():
    notes = {score_formula(f)["value_notes"] for f in _sample_formulas()}
    notes.discard(None)
    assert len(notes) > 100  # enough different cells to meet most of the registered notes
    coded = [short_notes(n) for n in sorted(notes)]
    assert coded == [_every_pattern(n) for n in sorted(notes)]
    # the filter skips patterns; a cell that holds every registered note still gets every code
    assert sum(c != n for c, n in zip(coded, sorted(notes))) > len(notes) // 2


def _filled_cache(formulas: list[str], max_entries: int = 200_000) -> FormulaCache:
    cache = FormulaCache(max_entries=max_entries)
    cache.set_output_digits()
    cache.set_short_notes()
    for start in range(0, len(formulas), 97):  # several appends: chunks as the workers return them
        chunk = formulas[start:start + 97]
        cache.add(chunk, score_values(chunk))
        cache.arrays()
    return cache


@pytest.mark.parametrize("index_type", [pa.int32(), pa.int64()])
def test_cache_take_equals_arrow_take(index_type):
    formulas = _sample_formulas()[:500] + ["", "Xx2O"]  # error rows: nulls in most columns
    cache = _filled_cache(list(dict.fromkeys(formulas)))
    arrays = cache.arrays()
    rng = np.random.default_rng(5)
    rows = pa.array(rng.integers(0, len(cache), 3000), type=index_type)
    taken = cache.take(rows, range(len(arrays)))
    for k, array in enumerate(arrays):
        assert taken[k].equals(array.take(rows)), k
    # a slice of rows (an offset into its buffer) and rows with a null go the same way
    part = rows.slice(17, 1000)
    assert all(cache.take(part, [k])[k].equals(a.take(part)) for k, a in enumerate(arrays))
    with_null = pa.array([0, None, 2], type=index_type)
    assert all(cache.take(with_null, [k])[k].equals(a.take(with_null)) for k, a in enumerate(arrays))


def test_cache_take_after_eviction_and_more_rows():
    formulas = list(dict.fromkeys(_sample_formulas()))[:400]
    cache = _filled_cache(formulas[:300], max_entries=320)
    rows = pa.array(np.arange(len(cache))[::-1].copy(), type=pa.int64())
    before = cache.take(rows, range(len(cache.arrays())))  # numpy views made here
    cache.add(formulas[300:], score_values(formulas[300:]))  # evicts: rows renumbered, views dropped
    assert cache.evictions == 1
    arrays = cache.arrays()
    rows = pa.array(np.arange(len(cache)), type=pa.int64())
    after = cache.take(rows, range(len(arrays)))
    assert all(after[k].equals(a.take(rows)) for k, a in enumerate(arrays))
    assert len(before[0]) == 300


def test_a_formula_stored_again_keeps_every_row_its_own():
    # With read-ahead, a formula evicted while a batch waits is scored again
    # for that batch and may also come back in a worker's chunk for a later
    # batch: stored twice, it must not shift the rows of what comes after
    # (the cache's index against its arrays, through the next eviction).
    formulas = list(dict.fromkeys(_sample_formulas()))[:300]
    cache = FormulaCache(max_entries=320)
    cache.add(formulas[:200], score_values(formulas[:200]))
    cache.add(formulas[150:250], score_values(formulas[150:250]))  # 50 already stored
    cache.add(formulas[250:300], score_values(formulas[250:300]), keep=formulas[250:300])
    cache.add(formulas[:40], score_values(formulas[:40]), keep=formulas[:40])  # evicts
    assert cache.evictions == 1
    at = [c.name for c in output_columns()].index("formula_normalized")
    stored = list(cache.index)
    rows = pa.array([cache.index[f] for f in stored], type=pa.int64())
    assert cache.take(rows, [at])[at].to_pylist() == [score_formula(f)["formula_normalized"] for f in stored]
    assert cache.keys().to_pylist() == sorted(stored, key=cache.index.__getitem__)


def test_rows_found_after_submit_are_the_cache_rows():
    # a batch submitted before its formulas were scored (the engine reads ahead):
    # its rows are looked up among the keys stored since, and must be what
    # the cache's index says
    formulas = list(dict.fromkeys(_sample_formulas()))[:300]
    with BatchScorer(1) as scorer:
        scorer.columns(formulas[:50])  # some known before the ticket
        batch = pa.array(formulas[:200] * 2)
        ticket = scorer.submit(batch)
        rows = scorer.rows_of(ticket).to_pylist()
        assert rows == [scorer.cache.index[f] for f in formulas[:200] * 2]


# ----------------------------------------------- per-formula shortcuts of the workers

def _plain_cohesion_kJ_mol(alphas, open_sites, bond_strength, w) -> float:
    """molecular_cohesion_kJ_mol written out atom by atom, as before grouping."""
    total = sum(w["molecular_contact_kJ_mol"] + w["molecular_polarisability_kJ_mol_A3"] * a for a in alphas)
    return total + w["molecular_bridge_kJ_mol"] * max(open_sites, 0) * bond_strength


def test_grouped_molecular_cohesion_is_the_same_float_as_the_atom_by_atom_sum():
    from ionicity.scorer import melting_routes
    from ionicity.scorer.melting_index import TREND_WEIGHTS

    rng = random.Random(11)
    alphas_of = [0.67, 1.76, 1.10, 0.80, 2.18, 5.35, 3.03]  # a few distinct values, as a molecule has
    for _ in range(300):
        alphas = [rng.choice(alphas_of) for _ in range(rng.randint(1, 400))]
        rng.shuffle(alphas)
        args = (alphas, rng.randint(0, 3), rng.random())
        # exact equality: the same additions in the same order
        assert melting_routes.molecular_cohesion_kJ_mol(*args, TREND_WEIGHTS) == _plain_cohesion_kJ_mol(*args, TREND_WEIGHTS)


def test_one_polarisability_per_atom_in_composition_order():
    from ionicity.scorer import melting_routes

    for counts in ((("C", 6.0), ("H", 12.0), ("O", 6.0)), (("Cl", 4.0),), (("C", 40.0), ("H", 82.0), ("N", 1.0)),
                   (("H", 2.5), ("Br", 1.0))):
        plain = tuple(a for s, n in counts for a in [melting_routes._polarisability_A3(s)] * int(round(n)))
        assert melting_routes._atom_polarisabilities_A3(counts) == plain, counts


def _eager_explain(module, dec) -> list[str]:
    """Descriptor.explain with every step formatted when the result was made (the plain path)."""
    result = module.analyse(dec)
    steps = [s if isinstance(s, str) else s() for s in result.steps]
    indent = "  " if module.analyse.title else ""
    lines = [module.analyse.title] if module.analyse.title else []
    lines += [indent + s for s in steps]
    if module.analyse._summary is not None:
        lines += [indent + line for line in module.analyse._summary(result)]
    return lines + ["  note: " + n for n in result.notes if n not in steps]


@pytest.mark.parametrize("text, words", [
    # Pauling electronegativities C 2.55, H 2.20, O 3.44 (CRC Handbook via mendeleev)
    ("C6H6", ("no ions (covalent_molecular): composition C6(chi 2.55) H6(chi 2.20)", "dchi = max - min = 2.55 (C)"
              " - 2.20 (H) = 0.35")),
    ("C2H6O", ("composition C2(chi 2.55) H6(chi 2.20) O1(chi 3.44)",)),
])
def test_lazy_bond_character_step_is_written_when_explained(text, words):
    from ionicity.scorer import character
    from ionicity.scorer.formula import parse_formula
    from ionicity.scorer.ions import decompose

    dec = decompose(parse_formula(text))
    result = character.analyse(dec)
    assert any(not isinstance(s, str) for s in result.steps)  # not formatted while scoring
    explained = character.explain(dec)
    assert explained == _eager_explain(character, dec)
    for word in words:
        assert word in "\n".join(explained), (word, explained)


@pytest.mark.parametrize("text, atoms", [("TiCl4", 4), ("SiBr4", 4)])
def test_lazy_molecular_melting_lines_name_every_peripheral_atom(text, atoms):
    from ionicity.scorer import melting
    from ionicity.scorer.formula import parse_formula
    from ionicity.scorer.ions import decompose

    dec = decompose(parse_formula(text))
    result = melting.analyse(dec)
    assert result.molecular is not None and not result.route_steps  # the lines are not made yet
    lines = "\n".join(melting.explain(dec))
    assert f"cohesion: sum over {atoms} peripheral atoms" in lines
    alphas = lines.split("alphas ")[1].split(";")[0].split(", ")
    assert len(alphas) == atoms
    assert "molecular: T = dH_m / dS_m" in lines and "caution" in lines


@pytest.mark.parametrize("text, heavy", [("C7H8", 7), ("C2H6O", 3)])
def test_lazy_organic_melting_lines_count_the_heavy_atoms(text, heavy):
    # organic molecules take scorer.melting_organic (read unreduced): their lines name the
    # heavy-atom count, written only when explained
    from ionicity.scorer import melting
    from ionicity.scorer.formula import parse_formula
    from ionicity.scorer.ions import decompose

    dec = decompose(parse_formula(text))
    result = melting.analyse(dec)
    assert result.molecular is not None and not result.route_steps
    lines = "\n".join(melting.explain(dec))
    assert f"* {heavy} heavy atoms" in lines
    assert "organic molecule: T = dH_m / dS_m" in lines and "caution" in lines


def test_trend_index_on_floats_is_the_same_float_as_on_arrays():
    # the scorer's path (one compound, Python floats) against the array path, each argument
    # given as a 0-d array: exact equality, zero, negative, NaN and infinite inputs included
    from ionicity.scorer.melting_index import melting_trend_index

    rng = random.Random(5)
    edge = [0.0, -0.0, float("nan"), float("inf"), float("-inf"), 1e-300, -3.0]

    def value(scale):
        return rng.choice(edge) if rng.random() < 0.1 else rng.uniform(-0.2, 1.2) * scale

    with np.errstate(all="ignore"):
        for _ in range(3000):
            args = [value(3000.0), value(4.0), value(1.0), rng.random() < 0.5, value(1.0),
                    rng.choice([1, 2, 3, 5, 0, 2.5, float("nan")]), value(200.0), value(100.0),
                    *(value(1.0) for _ in range(9)), value(3.0)]
            on_floats = melting_trend_index(*args)
            on_arrays = melting_trend_index(*(np.asarray(a, dtype=float) for a in args))
            assert type(on_floats) is float and type(on_arrays) is float
            assert on_floats == on_arrays or (np.isnan(on_floats) and np.isnan(on_arrays)), args


# --- the organic path's cuts (DEVELOPERS.md, "The organic path, fifth round"): each against its plain form


def test_decomposition_with_fields_is_dataclasses_replace():
    import dataclasses

    from ionicity.scorer.formula import FormulaError, parse_formula
    from ionicity.scorer.ions import decompose

    decs = []
    for text in _sample_formulas()[:500]:
        try:
            decs.append(decompose(parse_formula(text)))
        except FormulaError:
            continue  # the demo inventory holds misspellings on purpose
    assert len(decs) > 400
    changes = [dict(substance_class="covalent_molecular", ionic_model="strained"), dict(cations=(), anions=()),
               dict(notes=("a note",), ionic_model_reasons=("why",), formal_ions=((), ())), {}]
    for dec in decs:
        for change in changes:
            fast, plain = dec.with_fields(**change), dataclasses.replace(dec, **change)
            assert fast == plain and hash(fast) == hash(plain)
            # the fields outside equality too (ionic_model, its reasons, the formal ions)
            assert all(getattr(fast, f.name) == getattr(plain, f.name) for f in dataclasses.fields(plain))
    with pytest.raises(TypeError, match="no field 'colour'"):
        decs[0].with_fields(colour="blue")


def test_state_text_cache_writes_what_the_plain_formatting_writes():
    from ionicity.scorer.grammar import format_count
    from ionicity.scorer.substance import format_oxidation_states

    def plain(states):
        parts = []
        for symbol, value in states:
            sign = "+" if value > 0 else ("-" if value < 0 else "")
            parts.append(f"{symbol}:{sign}{format_count(round(abs(value), 3))}")
        return ";".join(parts)

    rng = random.Random(5)
    values = [0.0, -0.0, 1, -2, 3.0, 2.6666666667, -0.4705882353, 1e-10, -1e-10, 7.9995, 0.0005]
    values += [rng.uniform(-8, 8) for _ in range(3000)] + [rng.randint(-4, 8) / rng.randint(1, 12) for _ in range(3000)]
    for i in range(0, len(values) - 3, 3):
        states = tuple(zip(("Fe", "C", "O"), values[i:i + 3]))
        assert format_oxidation_states(states) == plain(states)


def test_metal_set_and_cached_characters_match_the_element_records():
    from ionicity.scorer.character import _characters_pct, hannay_smyth_ionic_character_pct, pauling_ionic_character_pct
    from ionicity.scorer.elements import element_symbols, get_element, is_metal

    assert [is_metal(s) for s in element_symbols()] == [get_element(s).is_metal for s in element_symbols()]
    assert sum(is_metal(s) for s in element_symbols()) > 80  # mendeleev's series: most elements are metals
    assert not any(is_metal(x) for x in ("Xx", "", None, 3, "na", ["Na"]))
    chis = sorted({get_element(s).electronegativity_pauling for s in element_symbols()} - {None})
    chis = [c for c in chis if c == c]
    for a in chis:
        for b in chis:
            d = abs(a - b)
            assert _characters_pct(d) == (pauling_ionic_character_pct(d), hannay_smyth_ionic_character_pct(d))

@functools.cache
def _vocabulary_prefixes() -> frozenset:
    from ionicity.scorer.name_vocabulary import vocabulary

    return frozenset(k[:j] for k in vocabulary()[0] for j in range(1, len(k) + 1))


def _plain_tokenise(name: str):
    """scorer.name_vocabulary.tokenise as it was before the trie: every slice of the
    key looked up in the set of the vocabulary's prefixes, every elided stem and
    the digit pattern tried at every position."""
    from ionicity.scorer.name_vocabulary import _ELIDED, _NUMBER, MAX_NAME_LENGTH, Word, compact, vocabulary

    key = compact(name)
    if not key or len(key) > MAX_NAME_LENGTH:
        return None
    words, _ = vocabulary()
    prefixes = _vocabulary_prefixes()
    n = len(key)
    best = [None] * (n + 1)
    best[0] = (0, ())
    for i in range(n):
        if best[i] is None:
            continue
        cost, path = best[i]
        options = []
        j = i + 1
        while j <= n and key[i:j] in prefixes:
            word = words.get(key[i:j])
            if word is not None:
                options.append((j, word))
            j += 1
        for stem, value in _ELIDED.items():
            j = i + len(stem)
            if key.startswith(stem, i) and j < n and key[j] in "aeiou":
                options.append((j, Word(stem, "multiplier", number=value)))
        digits = _NUMBER.match(key, i)
        if digits:
            options.append((digits.end(), Word(digits.group(), "number", number=float(digits.group()))))
        for j, word in options:
            if best[j] is None or best[j][0] > cost + 1:
                best[j] = (cost + 1, path + (word,))
    return best[n][1] if best[n] else None


def test_trie_tokeniser_cuts_every_name_as_the_prefix_set_did():
    # the same words in the same order (Word equality: kind, symbol, ion, numbers), or None
    # for both: generated names of the benchmark's salts, every vocabulary word alone and in
    # random pairs and triples, elided multipliers, numbers (Arabic-Indic digits among them:
    # \d and str.isdecimal agree on them) and random letter soup
    from ionicity.scorer.name_vocabulary import tokenise, vocabulary

    names = [score_formula(f)["systematic_name"] for f in realistic_formulas(3000)]
    names = [n for n in names if n]
    assert len(names) > 200
    words = sorted(vocabulary()[0])
    rng = random.Random(11)
    names += words
    names += [" ".join(rng.sample(words, rng.choice((2, 3)))) for _ in range(3000)]
    names += ["dinitrogen pentoxide", "carbon monoxide", "osmium tetroxide", "copper(II) sulfate 5-hydrate",
              "iron(3+) chloride", "cobalt(II) chloride \u0666-hydrate", "sodium 2.5-hydrate", "nonahydrate"]
    names += ["".join(rng.choice("aehilmnoprstuxyz()0123456789") for _ in range(rng.randint(1, 40)))
              for _ in range(3000)]
    cut = 0
    for name in names:
        tokenise.cache_clear()
        fast = tokenise(name)
        assert fast == _plain_tokenise(name), name
        cut += fast is not None
    assert cut > 3000  # most names above are cut into words, the soup mostly not


def _plain_texts() -> list[str]:
    """Formula texts for the parser's shortcuts: the reference cases, the demo inventory, every
    formula column of tests/data, the benchmark's formulas, and random text over the plain
    alphabet and beyond it (Unicode dots and digits, signs, spaces, commas, brackets)."""
    texts = _sample_formulas() + realistic_formulas(20000)
    for name, column in (("inorganic_audit.csv", "formula"), ("lattice_reference.csv", "compound"),
                         ("name_cases.csv", "formula"), ("salt_hydrates_registry.csv", "formula")):
        texts += [r[column] for r in csv.DictReader(open(f"tests/data/{name}", encoding="utf-8"))]
    rng = random.Random(17)
    plain = "HCNOSKaFelMgubrI()[]{}\u00b7.*0123456789"
    other = plain + " ,+-\u2212\u2022\u00d7\u2082\u00b2\u0665x\u03b4\u00bd\u200b\ufeff"
    for alphabet in (plain, other):
        texts += ["".join(rng.choice(alphabet) for _ in range(rng.randint(1, 16))) for _ in range(4000)]
    texts += [f"{s}{sep}{w}H2O" for s in ("CuSO4", "Fe2(SO4)3", "(A", "A)", "K{Cl", "5", "", "Na[BF4]")
              for sep in ("*", ".", "\u00b7", "**", "..", "+") for w in ("", "0", "0.5", "5", "12", "1.", ".5", "5.5.5")]
    return list(dict.fromkeys(texts))


def test_plain_text_skips_only_steps_that_leave_it_as_it_is():
    # scorer.formula._PLAIN: for a plain text the steps parse_formula skips change nothing (no
    # solid-solution site, no written non-stoichiometry, no spaced or hyphenated ion pair) and
    # _normalise_text only writes the middle dot as the star
    from ionicity.scorer import formula

    plain = 0
    for text in _plain_texts():
        if formula._PLAIN.fullmatch(text) is None:
            continue
        plain += 1
        assert formula._SOLID_SOLUTION_SITE.search(text) is None, text
        assert formula._NONSTOICHIOMETRY.search(text) is None, text
        assert formula._shorthand_with_spaces(text) == text, text
        assert formula._normalise_text(text) == formula._plain_normalised(text), text
    assert plain > 20000
    # the middle dot of _PLAIN is the one _normalise_text maps; other dots and digits are not plain
    assert formula._DOT_SEPARATORS[0] == "\u00b7"
    for text in ("CuSO4\u20225H2O", "Na\u2082SO4", "CuSO4\u00b7\u0665H2O", "NaCl ", "Fe1-xO", "Cu(In,Ga)Se2"):
        assert formula._PLAIN.fullmatch(text) is None, text


def test_salt_and_water_split_is_the_loop_split():
    # scorer.formula._split_components takes a salt and its counted water by one regular expression;
    # the character loop it skips gives the same parts (brackets balanced or not, decimals, empty parts)
    from ionicity.scorer import formula

    taken = 0
    for text in _plain_texts():
        for cleaned in {text, formula._plain_normalised(text)}:
            assert formula._split_components(cleaned) == formula._split_components_loop(cleaned), cleaned
            taken += formula._SALT_AND_WATER.fullmatch(cleaned) is not None
    assert taken > 10000


def test_a_blend_word_needs_a_space():
    # scorer.mixture._blend looks for the trailing words of _BLEND_WORDS only in a key with a space:
    # each of them starts with one (the look-up of the whole key is unchanged)
    from ionicity.scorer import mixture

    assert all(word.startswith(" ") for word in mixture._BLEND_WORDS)
    assert mixture.names_a_blend("FLiNaK") and mixture.names_a_blend("Solar salt")
    assert mixture.names_a_blend("FLiNaK eutectic") and not mixture.names_a_blend("NaCl")
