//! Bytes → a function of up to 9 inputs with don't-cares (and a second
//! output) → every operation of the logic engine: exact sums and products,
//! the heuristic, redundancy, hazards, gate networks and multi-output
//! minimization must not panic, and must agree with the function and with
//! each other (`implica_fuzz::logic::check_logic`).
#![no_main]

use libfuzzer_sys::fuzz_target;

fuzz_target!(|data: &[u8]| implica_fuzz::logic::check_logic(data));
