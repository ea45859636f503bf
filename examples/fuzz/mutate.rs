//! Seeded mutations of layout files, for the fuzz harness (`examples/fuzz/main.rs`) and
//! its bounded run in the test suite (`tests/cli/fuzz_bounded.rs`).
//!
//! Takes a layout's text and a seed, gives a mutated text. Two kinds, chosen by the
//! seed: *structured* mutations read the YAML into a tree, change one to three nodes
//! (a number made huge, tiny, negative, non-finite or just over a limit; a text made
//! long or strange; a list item repeated many times; a key dropped; a value nested or
//! replaced by one of another type) and write it back, so that the result still reads
//! and reaches the later checks; *raw* mutations change bytes (flip, insert, delete,
//! repeat a range, insert a YAML token such as `---`, `<<:`, `&a`, `*a`, a tab, a
//! byte-order mark or a byte that is not UTF-8, or cut the file short), so that the
//! reader meets broken input. The same text and seed always give the same mutation.

use serde_yaml::Value;

/// A small deterministic generator (SplitMix64; Steele, Lea & Flood, "Fast splittable
/// pseudorandom number generators", OOPSLA 2014).
pub struct Rng(u64);

impl Rng {
    /// A generator from a seed.
    pub fn new(seed: u64) -> Rng {
        Rng(seed)
    }
    /// The next 64 random bits.
    pub fn next(&mut self) -> u64 {
        self.0 = self.0.wrapping_add(0x9E37_79B9_7F4A_7C15);
        let mut z = self.0;
        z = (z ^ (z >> 30)).wrapping_mul(0xBF58_476D_1CE4_E5B9);
        z = (z ^ (z >> 27)).wrapping_mul(0x94D0_49BB_1331_11EB);
        z ^ (z >> 31)
    }
    /// A number below `n` (`n` > 0).
    pub fn below(&mut self, n: usize) -> usize {
        (self.next() % n as u64) as usize
    }
    /// True one time in `n`.
    pub fn one_in(&mut self, n: usize) -> bool {
        self.below(n) == 0
    }
}

/// Mutates `text` with the mutation the seed picks; `structured_only` keeps to tree
/// mutations (for runs through the whole pipeline, where broken YAML stops early).
pub fn mutate(text: &str, seed: u64, structured_only: bool) -> Vec<u8> {
    let mut rng = Rng::new(seed);
    if structured_only || rng.below(3) != 0 {
        if let Some(t) = structured(text, &mut rng) {
            return t.into_bytes();
        }
    }
    raw(text.as_bytes(), &mut rng)
}

/// One to three tree mutations; `None` when the text does not read as YAML.
pub fn structured(text: &str, rng: &mut Rng) -> Option<String> {
    let mut v: Value = serde_yaml::from_str(text).ok()?;
    for _ in 0..1 + rng.below(3) {
        let n = count(&v);
        let target = rng.below(n.max(1));
        let mut k = 0;
        change(&mut v, target, &mut k, rng);
    }
    serde_yaml::to_string(&v).ok()
}

/// Nodes in the tree.
fn count(v: &Value) -> usize {
    1 + match v {
        Value::Sequence(s) => s.iter().map(count).sum(),
        Value::Mapping(m) => m.values().map(count).sum(),
        Value::Tagged(t) => count(&t.value),
        _ => 0,
    }
}

/// Changes the `target`-th node in preorder (`k` counts the nodes passed).
fn change(v: &mut Value, target: usize, k: &mut usize, rng: &mut Rng) -> bool {
    if *k == target {
        replace(v, rng);
        return true;
    }
    *k += 1;
    match v {
        Value::Sequence(s) => {
            for i in 0..s.len() {
                if change(&mut s[i], target, k, rng) {
                    if rng.one_in(6) && s.len() > 0 {
                        // Repeat the changed item (a row of pads, a long bus, many icons).
                        let item = s[i].clone();
                        let times = [2, 10, 150, 1200][rng.below(4)];
                        s.extend(std::iter::repeat_n(item, times));
                    }
                    return true;
                }
            }
            false
        }
        Value::Mapping(m) => {
            let keys: Vec<Value> = m.keys().cloned().collect();
            for key in keys {
                let hit = match m.get_mut(&key) {
                    Some(child) => change(child, target, k, rng),
                    None => false,
                };
                if hit {
                    if rng.one_in(8) {
                        m.remove(&key);
                    }
                    return true;
                }
            }
            false
        }
        _ => false,
    }
}

/// Values a number may become: huge, tiny, negative, non-finite, near the limits.
const NUMBERS: &[f64] = &[
    0.0, -1.0, 1e-300, 1e-9, 0.001, 999.999, 1000.0, 1000.001, 1e4, 1e9, 1e20, 1e300, -1e300, 4294967295.0,
    4294967296.0, 2147483648.0, 1e6, 65.0, 201.0, 100.0, 101.0,
];

fn replace(v: &mut Value, rng: &mut Rng) {
    *v = match (&*v, rng.below(10)) {
        (Value::Number(n), 0..=5) => {
            let x = n.as_f64().unwrap_or(1.0);
            match rng.below(4) {
                0 => Value::from(NUMBERS[rng.below(NUMBERS.len())]),
                1 => Value::from(x * [0.5, 0.9, 1.1, 2.0, 10.0, -1.0][rng.below(6)]),
                2 => Value::from([f64::NAN, f64::INFINITY, f64::NEG_INFINITY][rng.below(3)]),
                _ => Value::from(x + [-0.1, 0.05, 1.0, 3.0][rng.below(4)]),
            }
        }
        (Value::String(s), 0..=4) => {
            let s = s.clone();
            Value::from(match rng.below(6) {
                0 => s.repeat(1 + rng.below(300)),
                1 => String::new(),
                2 => format!("{s}µm"),
                3 => "ÅΩ😀\u{202e}".to_string(),
                4 => format!("{} mm", NUMBERS[rng.below(NUMBERS.len())]),
                _ => "x".repeat([64, 65, 231, 255, 300, 5000][rng.below(6)]),
            })
        }
        (Value::Sequence(s), 0..=3) if !s.is_empty() => {
            let mut s = s.clone();
            let i = rng.below(s.len());
            let item = s[i].clone();
            let times = [1, 10, 300, 2000][rng.below(4)];
            s.extend(std::iter::repeat_n(item, times));
            Value::Sequence(s)
        }
        (_, 6) => Value::Sequence(vec![v.clone()]),
        (_, 7) => Value::Null,
        (_, 8) => Value::from(true),
        _ => Value::from(NUMBERS[rng.below(NUMBERS.len())]),
    };
}

/// YAML tokens and bytes that readers trip over.
const TOKENS: &[&[u8]] = &[
    b"---\n", b"...\n", b"<<: ", b"&a ", b"*a", b"[", b"]", b"{", b"}", b"\t", b"\xEF\xBB\xBF", b"\xFF", b"\xC3",
    b": ", b"- ", b"\n", b"#", b"\"", b"'", b"!!binary ", b"? ", b"|\n", b".nan", b"1e999", b"\0",
];

/// One to four byte-level changes.
pub fn raw(bytes: &[u8], rng: &mut Rng) -> Vec<u8> {
    let mut b = bytes.to_vec();
    for _ in 0..1 + rng.below(4) {
        let at = if b.is_empty() { 0 } else { rng.below(b.len() + 1) };
        match rng.below(6) {
            0 if !b.is_empty() => {
                let i = at.min(b.len() - 1);
                b[i] ^= 1 << rng.below(8);
            }
            1 => {
                let t = TOKENS[rng.below(TOKENS.len())];
                b.splice(at..at, t.iter().copied());
            }
            2 => {
                let end = (at + rng.below(40)).min(b.len());
                b.drain(at..end);
            }
            3 => {
                let end = (at + 1 + rng.below(80)).min(b.len());
                let piece = b[at.min(end)..end].to_vec();
                let times = [2, 20, 500][rng.below(3)];
                for _ in 0..times {
                    b.splice(at..at, piece.iter().copied());
                }
            }
            4 => b.truncate(at),
            _ => {
                let x = (rng.next() & 0xFF) as u8;
                b.insert(at, x);
            }
        }
    }
    b
}
