#!/usr/bin/env python3
"""Which middle-common chains can route a fourteen-segment digit at 1/3 duty?

A planar model of one digit (docs/architecture.md, *Multiplexing*): the middle common is
a chain of segments from the digit's left side to its right side; the top common's
segments must lie above it, the bottom common's below, and each SEG line crosses the
chain at its own middle-common segment, so every segment above needs a different chain
segment next to it. Prints, for chains of LEN segments, the divisions that fit LINES
SEG lines a digit (at most LINES segments above and below, one of each common a line),
first with chains whose neighbouring segments meet side by side at a
node (`direct`), then allowing a chain to pass a node between other segments' tips.

Usage: python3 examples/fourteen_chains.py [LEN] [LINES] [--no-dp]
Standard library only. Segment names and nodes follow fonts-strokes/segments.strokes.
"""
import itertools
import sys

NODES = {'TL': (0, 1), 'T': (.5, 1), 'TR': (1, 1), 'L': (0, .5), 'C': (.5, .5), 'R': (1, .5),
         'BL': (0, 0), 'B': (.5, 0), 'BR': (1, 0)}
SEGMENTS = {'a': ['TL', 'T', 'TR'], 'i': ['T', 'C'], 'f': ['L', 'TL'], 'b': ['TR', 'R'],
            'g1': ['L', 'C'], 'g2': ['C', 'R'], 'h': ['TL', 'C'], 'j': ['TR', 'C'],
            'e': ['BL', 'L'], 'c': ['BR', 'R'], 'm': ['BL', 'C'], 'k': ['BR', 'C'],
            'l': ['B', 'C'], 'd': ['BL', 'B', 'BR']}

# Segments side by side around a node (consecutive by angle), and the point beside d/c.
NEXT = set()
def _ring(*names):
    for x, y in zip(names, names[1:] + names[:1]):
        NEXT.add(frozenset((x, y)))
_ring('a', 'f', 'h'); NEXT.add(frozenset(('i', 'a'))); _ring('a', 'j', 'b'); _ring('f', 'g1', 'e')
_ring('b', 'g2', 'c'); _ring('e', 'm', 'd'); _ring('d', 'k', 'c'); NEXT.add(frozenset(('l', 'd')))
_ring('g2', 'j', 'i', 'h', 'g1', 'm', 'l', 'k'); NEXT.add(frozenset(('c', 'dp'))); NEXT.add(frozenset(('d', 'dp')))

SIZE = 120  # raster for telling above from below


def chains(length):
    """Every path of `length` segments from a left-side node to a right-side node."""
    out = []
    def walk(node, used, seq):
        if len(used) == length:
            if node in ('TR', 'R', 'BR'):
                out.append(seq)
            return
        for s, nodes in SEGMENTS.items():
            if s not in used and node in nodes:
                for other in nodes:
                    if other != node:
                        walk(other, used | {s}, seq + [(node, s, other)])
    for start in ('TL', 'L', 'BL'):
        walk(start, frozenset(), [])
    return out


def above_below(seq, with_dp):
    """Segments off the chain above it (reached from the top edge) and below it."""
    wall = [[False] * (SIZE + 1) for _ in range(SIZE + 1)]
    def px(n):
        x, y = NODES[n]
        return int(20 + x * 80), int(20 + y * 80)
    def line(p, q):
        n = max(abs(q[0] - p[0]), abs(q[1] - p[1]), 1)
        for t in range(n + 1):
            x, y = round(p[0] + (q[0] - p[0]) * t / n), round(p[1] + (q[1] - p[1]) * t / n)
            for dx, dy in itertools.product((-1, 0, 1), repeat=2):
                if 0 <= x + dx <= SIZE and 0 <= y + dy <= SIZE:
                    wall[y + dy][x + dx] = True
    x0, y0 = px(seq[0][0]); line((0, y0), (x0, y0))
    for u, s, v in seq:
        nodes = SEGMENTS[s]; i, j = nodes.index(u), nodes.index(v); step = 1 if j > i else -1
        for k in range(i, j, step):
            line(px(nodes[k]), px(nodes[k + step]))
    x1, y1 = px(seq[-1][2]); line((x1, y1), (SIZE, y1))
    top = [[False] * (SIZE + 1) for _ in range(SIZE + 1)]
    stack = [(x, SIZE) for x in range(SIZE + 1) if not wall[SIZE][x]]
    for x, y in stack:
        top[y][x] = True
    while stack:
        x, y = stack.pop()
        for dx, dy in ((1, 0), (-1, 0), (0, 1), (0, -1)):
            X, Y = x + dx, y + dy
            if 0 <= X <= SIZE and 0 <= Y <= SIZE and not wall[Y][X] and not top[Y][X]:
                top[Y][X] = True
                stack.append((X, Y))
    chain = {s for _, s, _ in seq}
    up, down = [], []
    for s, nodes in SEGMENTS.items():
        if s in chain:
            continue
        a, b = px(nodes[0]), px(nodes[1])
        for f in (0.5, 0.4, 0.6, 0.3, 0.7):
            x, y = round(a[0] + (b[0] - a[0]) * f), round(a[1] + (b[1] - a[1]) * f)
            if not wall[y][x]:
                (up if top[y][x] else down).append(s)
                break
    if with_dp:
        x, y = px('BR')
        (up if top[y][x + 8] else down).append('dp')
    return up, down


def matching(left, right):
    """One way to give each segment of `left` a different neighbour in `right`, if any."""
    for perm in itertools.permutations(right, len(left)):
        if all(frozenset((x, y)) in NEXT for x, y in zip(left, perm)):
            return list(zip(left, perm))
    return None


def main():
    args = [a for a in sys.argv[1:] if not a.startswith('--')]
    length = int(args[0]) if args else 5
    lines = int(args[1]) if len(args) > 1 else 5
    with_dp = '--no-dp' not in sys.argv
    for direct in (True, False):
        print('chains meeting side by side at every node' if direct else 'chains that may pass a node between other tips')
        seen = set()
        for seq in chains(length):
            chain = [s for _, s, _ in seq]
            if direct and not all(frozenset((p, q)) in NEXT for p, q in zip(chain, chain[1:])):
                continue
            up, down = above_below(seq, with_dp)
            if not up or len(up) > lines or len(down) > lines:
                continue
            m = matching(up, chain)
            if m is None:
                continue
            key = (tuple(sorted(chain)), tuple(sorted(up)))
            if key not in seen:
                seen.add(key)
                print(f'  chain {" ".join(chain)}; above {" ".join(up)}; below {" ".join(down)}; crossings {m}')
        print(f'  {len(seen)} found')


if __name__ == '__main__':
    main()
