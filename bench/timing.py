"""Timing helper of the bench: timeit repeats, median kept."""
import timeit


class Settings:
    """How hard to time: quick runs use fewer and shorter repeats."""

    def __init__(self, quick):
        self.quick = quick
        # Repeats per timing (the median is kept) and the least time one repeat runs.
        # Many short repeats: the median then shrugs off bursts of other work.
        self.repeats = 7 if quick else 21
        self.min_repeat_s = 0.002 if quick else 0.01


def time_call(fn, args, kwargs, st):
    """(median, min) seconds per call of fn(*args, **kwargs) over st.repeats timeit runs,
    each long enough (st.min_repeat_s) for the clock."""
    t = timeit.Timer("f(*a, **k)", globals={"f": fn, "a": args, "k": kwargs})
    number = 1
    while True:
        dt = t.timeit(number)
        if dt >= st.min_repeat_s or number >= 1 << 24:
            break
        number *= 2 if dt <= 0 else max(2, min(10, int(st.min_repeat_s / dt * 1.2) + 1))
    runs = sorted(t.repeat(st.repeats, number))
    return runs[len(runs) // 2] / number, runs[0] / number


def _reference_work():
    # A fixed pure-Python workload (float arithmetic and calls, like the library's).
    x = 0.0
    for i in range(200):
        x += (i * 0.5 + 1.0) / (i + 2.0)
    return x


def calibration_us(st):
    """Median time, us, of a fixed pure-Python workload: divide a result by it to compare
    runs on busy or different machines."""
    return 1e6 * time_call(_reference_work, (), {}, st)[0]
