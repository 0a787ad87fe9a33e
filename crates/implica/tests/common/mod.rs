//! Running the `implica` binary from the CLI tests; each test file uses a
//! part of this.
#![allow(dead_code)]

use std::io::Write;
use std::path::{Path, PathBuf};
use std::process::{Command, Output, Stdio};

/// The workspace root (where `examples/` is).
pub fn root() -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR")).join("../..")
}

fn command() -> Command {
    let mut c = Command::new(env!("CARGO_BIN_EXE_implica"));
    c.env_remove("NO_COLOR");
    c
}

/// `implica args`, with no input.
pub fn implica(args: &[&str]) -> Output {
    command().args(args).output().expect("run implica")
}

/// `implica args` reading `input` on standard input.
pub fn implica_stdin(args: &[&str], input: &[u8]) -> Output {
    spawn(command().args(args), input)
}

/// `implica args` in directory `dir`, reading `input` on standard input.
pub fn implica_stdin_in(dir: &Path, args: &[&str], input: &[u8]) -> Output {
    spawn(command().args(args).current_dir(dir), input)
}

fn spawn(c: &mut Command, input: &[u8]) -> Output {
    let mut child = c
        .stdin(Stdio::piped())
        .stdout(Stdio::piped())
        .stderr(Stdio::piped())
        .spawn()
        .expect("run implica");
    // A command that exits without reading its input closes the pipe
    // early; what it printed is still checked.
    let _ = child.stdin.take().unwrap().write_all(input);
    child.wait_with_output().unwrap()
}
