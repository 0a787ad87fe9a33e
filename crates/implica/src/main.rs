//! The `implica` command: check, format and (in later releases) minimize and
//! export combinational logic written in Implica.

mod check;
mod files;
mod fmt;

use clap::{Parser, Subcommand, ValueEnum};

// The syntax tree is many small allocations; mimalloc makes them several
// times cheaper than the system allocator (docs/benchmarks.md).
#[global_allocator]
static GLOBAL: mimalloc::MiMalloc = mimalloc::MiMalloc;
use std::path::PathBuf;
use std::process::ExitCode;

/// Checks, formats and minimizes combinational logic written in Implica (`*.imp`).
#[derive(Parser)]
#[command(name = "implica", version, about)]
struct Cli {
    #[command(subcommand)]
    command: Command,
}

#[derive(Subcommand)]
enum Command {
    /// Report the faults in `.imp` files (directories are searched recursively; `-` reads standard input).
    ///
    /// Exit status: 0 when nothing at error severity was found, 1 when something was,
    /// 2 when a file could not be read or the arguments are wrong.
    Check {
        /// Files or directories to check.
        #[arg(required = true)]
        paths: Vec<PathBuf>,
        /// Output format.
        #[arg(long, value_enum, default_value_t = OutputFormat::Human)]
        format: OutputFormat,
    },
    /// Rewrite `.imp` files in the canonical layout (directories are searched recursively).
    ///
    /// `-` formats standard input to standard output. Files with syntax errors are left
    /// untouched. Exit status: 0 when done (or, with --check, when every file is already
    /// formatted), 1 with --check when a file would change, 2 when a file could not be read,
    /// parsed or written.
    Fmt {
        /// Files or directories to format.
        #[arg(required = true)]
        paths: Vec<PathBuf>,
        /// Do not write; list the files that would change and exit 1 if there are any.
        #[arg(long)]
        check: bool,
    },
    /// Print the syntax tree of a file (for contributors).
    #[command(hide = true)]
    SyntaxTree {
        path: PathBuf,
        /// Show byte spans.
        #[arg(long)]
        spans: bool,
    },
}

/// Formats of `implica check` output.
#[derive(Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum OutputFormat {
    /// Source snippets with underlines, for people.
    Human,
    /// One JSON document (schema in docs/json-output.md).
    Json,
}

fn main() -> ExitCode {
    let cli = Cli::parse();
    match cli.command {
        Command::Check { paths, format } => check::run(&paths, format),
        Command::Fmt { paths, check } => fmt::run(&paths, check),
        Command::SyntaxTree { path, spans } => match files::read_input(&path) {
            Ok(bytes) => {
                let (text, error) = implica_syntax::decode(&bytes);
                let (tree, mut errors) = implica_syntax::parse(&text);
                errors.extend(error);
                print!("{}", implica_syntax::dump::dump(&tree, spans));
                for e in errors {
                    println!("error @{}..{}: {}", e.span.start, e.span.end, e.message);
                }
                ExitCode::SUCCESS
            }
            Err(e) => {
                eprintln!("implica: {e}");
                ExitCode::from(2)
            }
        },
    }
}
