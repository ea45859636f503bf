//! The integration tests, as one test binary: each module runs the real `segmask` CLI
//! (or the library's public pipeline) on real layouts. One binary links once where
//! twenty linked twenty times, and lets the modules share demo builds
//! (`demo_build`), so README's test command stays short on a fresh clone.

mod demo_build;
mod emit_fixture;
#[path = "../../examples/benchmark/layout_gen.rs"]
#[allow(dead_code)]
mod layout_gen;
#[path = "../../examples/benchmark/presets.rs"]
mod presets;
#[path = "../../examples/fuzz/mutate.rs"]
mod mutate;

mod bad_layouts;
mod bar_graph;
mod check_json;
mod citations;
mod benchmark_layout;
mod daily_loop;
mod default_gap;
mod demo_films;
mod emit_files;
mod emit_film;
mod emit_gds;
mod emit_segmap;
mod film_text;
mod findings;
mod gap_hints;
mod held_ways;
mod line_delay;
mod firmware_tables;
mod fuzz_bounded;
mod laser_rules;
mod multiplex;
mod output_set;
mod panel;
mod png_films;
mod preview_labels;
mod position_sweep;
mod reference;
mod registration_demo;
mod robust;
mod schema;
mod show_display;
