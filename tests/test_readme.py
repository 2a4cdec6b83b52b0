"""The README's library examples run and print what the README says (doctest)."""
import doctest
import os

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))


def test_readme_examples():
    with open(os.path.join(ROOT, "README.md")) as f:
        text = f.read()
    parser = doctest.DocTestParser()
    test = parser.get_doctest(text, {}, "README.md", "README.md", 0)
    assert len(test.examples) >= 6
    runner = doctest.DocTestRunner(optionflags=doctest.NORMALIZE_WHITESPACE)
    runner.run(test)
    assert runner.failures == 0
