"""mulberry32 written again from its definition in plain Python integers (no JavaScript
semantics borrowed), to pin the first outputs of shared/stats/random.ts.
Definition: state += 0x6D2B79F5 (mod 2^32); t = state; t = (t ^ t>>15) * (t | 1);
t ^= t + (t ^ t>>7) * (t | 61); output ((t ^ t>>14) mod 2^32) / 2^32, all products mod 2^32.
Seed rule: an integer seed is reduced modulo 2^32 (Python's % gives the same as JS `>>> 0`).
Run: python3 tests/reference/mulberry32.py
"""
M = 2**32


def mulberry32(seed):
    state = seed % M

    def draw():
        nonlocal state
        state = (state + 0x6D2B79F5) % M
        t = state
        t = ((t ^ (t >> 15)) * (t | 1)) % M
        t = (t ^ ((t + ((t ^ (t >> 7)) * (t | 61)) % M) % M)) % M
        return ((t ^ (t >> 14)) % M) / M

    return draw


if __name__ == "__main__":
    for seed in (0, 1, 42, -1, 2**32 + 42):
        draw = mulberry32(seed)
        print(seed, [repr(draw()) for _ in range(10)])
