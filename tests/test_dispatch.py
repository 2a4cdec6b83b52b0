"""lapsecalc.dispatch on its own: a refused line's text (its caps, the form of a
corner the library did not foresee), as Session.feed uses it. The lines through the
whole shell are in tests/test_shell.py; these pin the edges no typed line reaches.
No outside facts: the expected texts are the module's own documented forms."""
from lapsecalc.shell import Session
from lapsecalc.dispatch import refusal_text


def test_a_refusal_text_is_capped_at_300_characters():
    # No typed line makes a refusal this long (the longest of the refusal corpus,
    # tests/refusal_corpus.py, is under 150 characters): the cap is a guard, so it is
    # checked here directly. "x" has none of the marks that send a text to retell.
    s = Session()
    assert refusal_text(s, ValueError("x" * 300), "temp") == "x" * 300
    assert refusal_text(s, ValueError("x" * 301), "temp") == "x" * 300 + "..."
    assert refusal_text(s, ValueError("x" * 400), "temp") == "x" * 300 + "..."


def test_an_unforeseen_error_is_named_with_its_text_capped_at_200():
    s = Session()
    assert refusal_text(s, ZeroDivisionError("float division by zero"), "report") == (
        "cannot compute that (ZeroDivisionError: float division by zero); nothing changed")
    assert refusal_text(s, RuntimeError("y" * 200), "report") == (
        "cannot compute that (RuntimeError: %s); nothing changed" % ("y" * 200))
    assert refusal_text(s, RuntimeError("y" * 250), "report") == (
        "cannot compute that (RuntimeError: %s...); nothing changed" % ("y" * 200))
