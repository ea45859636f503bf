//! The firmware tables as the real `segmask build` writes them: a C program compiled with
//! the machine's C compiler from `NAME.firmware.h` shows texts and must set exactly the
//! (COM, SEG) bits that the segment map (`NAME.segmap.csv`) gives the lit segments; the
//! JSON gives the same bits for every digit's characters.

use crate::demo_build;

use std::collections::{BTreeMap, BTreeSet};
use std::path::Path;
use std::process::Command;

/// Seven-segment shapes as the usual byte, bit 0 = a … bit 6 = g (common practice, as
/// printed in seven-segment driver data sheets; from memory, and it agrees with
/// docs/background.md, *Seven-segment patterns*).
fn seven_bits(c: char) -> u8 {
    let digits = [0x3F, 0x06, 0x5B, 0x4F, 0x66, 0x6D, 0x7D, 0x07, 0x7F, 0x6F];
    digits[c.to_digit(10).unwrap() as usize]
}

/// element → (com, seg) from the segment map.
fn segmap(out: &Path, name: &str) -> BTreeMap<String, (u32, u32)> {
    demo_build::segmap(out, name)
        .into_iter()
        .map(|(e, r)| (e, (r["com"].parse().unwrap(), r["seg"].parse().unwrap())))
        .collect()
}

/// The bits a text lights by hand: digit i shows the i-th character (segments from the
/// usual bytes), a `.` lights `{group}{i}.dp` when the segment map has it, a `:` the
/// colon after digit i (`col`, or its two dots `col_top` and `col_bottom` when
/// multiplexed).
fn expected(map: &BTreeMap<String, (u32, u32)>, group: &str, text: &str) -> BTreeSet<(u32, u32)> {
    let mut bits = BTreeSet::new();
    let mut pos = 0;
    for c in text.chars() {
        if c == '.' {
            if let Some(b) = map.get(&format!("{group}{pos}.dp")) {
                bits.insert(*b);
            }
            continue;
        }
        if c == ':' {
            for s in ["col", "col_top", "col_bottom"] {
                if let Some(b) = map.get(&format!("{group}{pos}.{s}")) {
                    bits.insert(*b);
                }
            }
            continue;
        }
        pos += 1;
        for (i, s) in ["a", "b", "c", "d", "e", "f", "g"].iter().enumerate() {
            if seven_bits(c) >> i & 1 == 1 {
                bits.insert(map[&format!("{group}{pos}.{s}")]);
            }
        }
    }
    bits
}

/// Compiles a program that shows each argument through the header and prints the bits
/// set, one `com seg` a line, then `missed N`.
fn run_c(dir: &Path, out: &Path, name: &str, texts: &[&str]) -> Vec<(BTreeSet<(u32, u32)>, u32)> {
    let id = name.replace('-', "_");
    let up = id.to_uppercase();
    let src = format!(
        "#include <stdio.h>\n#include <string.h>\n#include \"{name}.firmware.h\"\n\
         int main(int argc, char **argv) {{\n\
           int i, c, s;\n\
           for (i = 1; i < argc; i++) {{\n\
             uint8_t frame[{up}_COMS][{up}_SEG_BYTES];\n\
             int missed;\n\
             memset(frame, 0, sizeof frame);\n\
             missed = {id}_show_text(frame, argv[i]);\n\
             for (c = 1; c <= {up}_COMS; c++)\n\
               for (s = 1; s <= {up}_SEGS; s++)\n\
                 if (frame[c - 1][(s - 1) / 8] >> ((s - 1) % 8) & 1) printf(\"%d %d\\n\", c, s);\n\
             printf(\"missed %d\\n\", missed);\n\
           }}\n\
           return 0;\n\
         }}\n"
    );
    let c_file = dir.join("main.c");
    std::fs::write(&c_file, src).unwrap();
    let exe = dir.join("show");
    let cc = std::env::var("CC").unwrap_or_else(|_| "cc".into());
    let o = Command::new(&cc)
        .args(["-std=c99", "-Wall", "-Wextra", "-pedantic", "-Werror", "-I"])
        .arg(out)
        .arg(&c_file)
        .arg("-o")
        .arg(&exe)
        .output()
        .unwrap_or_else(|e| panic!("the C compiler `{cc}` must be installed: {e}"));
    assert!(o.status.success(), "{name}: the header must compile cleanly:\n{}", String::from_utf8_lossy(&o.stderr));
    let o = Command::new(&exe).args(texts).output().unwrap();
    let text = String::from_utf8(o.stdout).unwrap();
    let mut runs = vec![];
    let mut bits = BTreeSet::new();
    for l in text.lines() {
        if let Some(n) = l.strip_prefix("missed ") {
            runs.push((std::mem::take(&mut bits), n.parse().unwrap()));
        } else {
            let (c, s) = l.split_once(' ').unwrap();
            bits.insert((c.parse().unwrap(), s.parse().unwrap()));
        }
    }
    runs
}

/// Rain gauge (1/3 duty, a point after every digit) and kiln controller (1/4 duty, one
/// point after digit 2): "8.8.8.8" and "0123" through the compiled header set exactly the
/// bits the segment map gives; the kiln's glass has no point after digits 1 and 3, so two
/// dots are reported as not shown. The JSON agrees for "8" on every digit.
#[test]
fn c_header_sets_the_segment_map_bits() {
    for (name, group, missed_dots) in [("rain-gauge", "D", 0), ("kiln-controller", "T", 2)] {
        let (dir, out) = demo_build::build_demo(name);
        let map = segmap(&out, name);
        let runs = run_c(dir.path(), &out, name, &["8.8.8.8", "0123"]);
        assert_eq!(runs.len(), 2);
        assert_eq!(runs[0], (expected(&map, group, "8.8.8.8"), missed_dots), "{name} 8.8.8.8");
        assert_eq!(runs[1], (expected(&map, group, "0123"), 0), "{name} 0123");
        // Not a vacuous match: eight is all seven segments of four digits, plus points.
        assert!(runs[0].0.len() >= 28, "{name}: {:?}", runs[0]);

        let json: serde_json::Value =
            serde_json::from_slice(&std::fs::read(out.join(format!("{name}.firmware.json"))).unwrap()).unwrap();
        for d in json["digits"].as_array().unwrap() {
            let pos = d["position"].as_u64().unwrap();
            let eight = d["characters"].as_array().unwrap().iter().find(|c| c["char"] == "8").unwrap();
            let got: BTreeSet<(u32, u32)> = eight["bits"]
                .as_array()
                .unwrap()
                .iter()
                .map(|b| (b[0].as_u64().unwrap() as u32, b[1].as_u64().unwrap() as u32))
                .collect();
            let want: BTreeSet<(u32, u32)> =
                ["a", "b", "c", "d", "e", "f", "g"].iter().map(|s| map[&format!("{group}{pos}.{s}")]).collect();
            assert_eq!(got, want, "{name} digit {pos}");
        }
        // Every element that is not a digit segment is listed with its segment-map bit.
        for e in json["elements"].as_array().unwrap() {
            let (c, s) = map[e["element"].as_str().unwrap()];
            assert_eq!(e["bit"], serde_json::json!([c, s]));
        }
        let in_digit = |k: &str| k.strip_prefix(group).is_some_and(|r| r.starts_with(|c: char| c.is_ascii_digit()));
        let others = map.keys().filter(|k| !in_digit(k)).count();
        assert_eq!(json["elements"].as_array().unwrap().len(), others, "{name}");
    }
}

/// The darkroom timer (1/4 duty) has a colon of two elements after digit 2, its dots on
/// COM2 and COM3 of one SEG line: "12:34" through the compiled header sets both dots and
/// the digits' segments, exactly as the segment map gives them; "1234" sets no dot.
#[test]
fn c_header_lights_both_dots_of_a_multiplexed_colon() {
    let name = "darkroom-timer";
    let (dir, out) = demo_build::build_demo(name);
    let map = segmap(&out, name);
    let runs = run_c(dir.path(), &out, name, &["12:34", "1234"]);
    let dots = [map["T2.col_top"], map["T2.col_bottom"]];
    assert_eq!(runs[0], (expected(&map, "T", "12:34"), 0));
    assert!(dots.iter().all(|d| runs[0].0.contains(d)), "{:?}", runs[0]);
    assert_eq!(runs[1].0, &runs[0].0 - &dots.into_iter().collect());
}

