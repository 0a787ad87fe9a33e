//! The `implica` command: check, format, fix, minimize, tabulate and export
//! combinational logic written in Implica.

mod check;
mod document;
mod eval;
mod export;
mod files;
mod fix;
mod fmt;
mod minimize;
mod project;
mod refactor;
mod table;

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
    /// Exit status: 0 when nothing at error severity was found, 1 when something was (or,
    /// with --deny warnings, when a warning was), 2 when a file could not be read or the
    /// arguments are wrong.
    Check {
        /// Files or directories to check.
        #[arg(required = true)]
        paths: Vec<PathBuf>,
        /// Output format.
        #[arg(long, value_enum, default_value_t = OutputFormat::Human)]
        format: OutputFormat,
        /// Exit 1 also when there are diagnostics of this severity (`warnings`).
        #[arg(long, value_enum, value_name = "WHAT")]
        deny: Option<Deny>,
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
    /// Apply the fixes that are proven not to change any signal, in place (directories are
    /// searched recursively; `-` fixes standard input to standard output).
    ///
    /// Each fix was proven equivalent before it is offered; the fixes of one pass are proven
    /// again together, and passes repeat while fixes remain (a removed term may leave an
    /// input unused, which the next pass removes). Writes are atomic and keep permissions; a
    /// file that changed on disk meanwhile is left alone. Exit status: 0 when done, 1 when
    /// errors remain that no fix resolves, 2 when a file could not be read or written.
    Fix {
        /// Files or directories to fix.
        #[arg(required = true)]
        paths: Vec<PathBuf>,
        /// Also apply the fixes to review (they may change the file's interface, such as
        /// declaring a new output).
        #[arg(long = "unsafe")]
        review: bool,
        /// Print a unified diff of the fixes instead of writing them.
        #[arg(long)]
        diff: bool,
    },
    /// Print each signal's minimal sum of products and product of sums, with cost and
    /// certificate.
    ///
    /// Each signal is minimized over the inputs it reads, with its don't-cares and the
    /// `never` combinations free. Up to 16 inputs the result is exact (and says whether it is
    /// proven minimal, or how many terms are at least needed); past that, or past the exact
    /// budget, a heuristic finds a smaller equivalent form. Exit status: 0 when every signal
    /// was minimized, 1 when some signal has no function (see the message), 2 when the file
    /// cannot be read or a --signal is unknown.
    Minimize {
        /// The file (`-` reads standard input).
        file: PathBuf,
        /// Only this signal (repeat for several).
        #[arg(long = "signal", value_name = "NAME")]
        signals: Vec<String>,
        /// Which forms to print.
        #[arg(long, value_enum, default_value_t = minimize::Form2::Both)]
        form: minimize::Form2,
        /// Output format.
        #[arg(long, value_enum, default_value_t = minimize::MinimizeFormat::Text)]
        format: minimize::MinimizeFormat,
    },
    /// Print the value of every signal for one input vector (`--set a=1,b=0,...`).
    ///
    /// Values are `1`, `0`, or `free` where the signal's don't-cares leave it open. Exit
    /// status: 0, 1 when some signal has no function, 2 when an input is missing, unknown or
    /// set twice, or the file cannot be read.
    Eval {
        /// The file (`-` reads standard input).
        file: PathBuf,
        /// Input values, `NAME=0` or `NAME=1`, separated by commas (repeatable).
        #[arg(long, value_name = "NAME=V,...", required = true)]
        set: Vec<String>,
        /// Output format.
        #[arg(long, value_enum, default_value_t = eval::EvalFormat::Text)]
        format: eval::EvalFormat,
    },
    /// Print truth tables of signals (text mode adds Karnaugh maps for up to 6 inputs).
    ///
    /// Each signal's table is over the inputs it reads, the first one the most significant
    /// bit of the row number; `-` marks a don't-care. `--format csv` prints one table over all
    /// the inputs the selected signals read (at most 20). Exit status as for `minimize`.
    Table {
        /// The file (`-` reads standard input).
        file: PathBuf,
        /// Only this signal (repeat for several).
        #[arg(long = "signal", value_name = "NAME")]
        signals: Vec<String>,
        /// Output format.
        #[arg(long, value_enum, default_value_t = table::TableFormat::Text)]
        format: table::TableFormat,
        /// In text mode, print at most this many rows of each table.
        #[arg(long, value_name = "N", default_value_t = 1024)]
        max_rows: usize,
    },
    /// Write a Verilog module or a VHDL entity computing the file's outputs.
    ///
    /// The ports are the file's inputs and outputs, in declaration order; each output gets
    /// one continuous assignment of its minimal two-level form over the inputs it reads
    /// (with --as-written, each definition as written, intermediate signals as internal
    /// wires). Before anything is written, the logic is proven to give every signal the
    /// file's value wherever the file fixes it. Names that are reserved or illegal in the
    /// target language are changed, and the header lists them. Only files without errors
    /// are exported. Exit status: 0 when written, 1 when the file has errors or a signal has
    /// no function, 2 when a file cannot be read or written or --name cannot be used.
    Export {
        /// The file (`-` reads standard input).
        file: PathBuf,
        /// The language to write.
        #[arg(long, value_enum)]
        to: export::Target,
        /// Keep each definition as written instead of minimizing the outputs.
        #[arg(long)]
        as_written: bool,
        /// The module (or entity) name; by default, the file name without `.imp`.
        #[arg(long, value_name = "NAME")]
        name: Option<String>,
        /// Write to this file (atomically) instead of standard output.
        #[arg(long, short, value_name = "FILE")]
        output: Option<PathBuf>,
    },
    /// List the refactors offered at a place in a file, or apply one (--apply KIND).
    ///
    /// The place is `LINE` or `LINE:COLUMN`, counted from 1 (columns in characters): the
    /// statement there, or the name there for inlining. Refactors: `to-table` (an
    /// expression as a truth table), `to-expression` (a table or row list as minimal
    /// expressions), `to-nand` / `to-nor` (one gate kind only), `inline-here` /
    /// `inline-everywhere` (an intermediate signal replaced by its expression). Each is
    /// proven before it is offered: the same function for every signal, or, where it
    /// settles don't-cares (marked "to review"), a value the file allowed. Writes are
    /// atomic; `-` reads standard input and writes the result to standard output. Exit
    /// status: 0 when listed or applied, 1 when nothing (or not that refactor) is offered
    /// there, 2 when the file cannot be read or written or the place is not in it.
    Refactor {
        /// The file (`-` reads standard input).
        file: PathBuf,
        /// The place: LINE or LINE:COLUMN.
        #[arg(long, value_name = "LINE[:COL]")]
        at: String,
        /// Apply the refactor of this kind (as listed) instead of listing them.
        #[arg(long, value_name = "KIND")]
        apply: Option<String>,
        /// With --apply, print a unified diff instead of writing.
        #[arg(long, requires = "apply")]
        diff: bool,
    },
    /// List every rule: name, default severity (or `off`), one line on what it finds.
    Rules,
    /// Print a rule's full documentation: what it finds, why it matters, an example, the fix.
    ///
    /// Exit status: 0, or 2 when there is no such rule.
    Explain {
        /// The rule's name, as `implica rules` lists it.
        rule: String,
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

/// What `implica check --deny` turns into a failure.
#[derive(Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum Deny {
    /// Warnings fail the check as errors do.
    Warnings,
}

/// Formats of `implica check` output.
#[derive(Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum OutputFormat {
    /// Source snippets with underlines, for people.
    Human,
    /// One JSON document (schema in docs/json-output.md).
    Json,
    /// One SARIF 2.1.0 log (the OASIS standard): the rules, each result with its
    /// locations, related locations and fixes.
    Sarif,
    /// One GitHub Actions workflow command per diagnostic (`::error file=...::...`), so
    /// that findings appear as annotations on the changed lines.
    Github,
}

fn main() -> ExitCode {
    // Output piped into `head` and the like: stop quietly when the reader
    // goes away, as command-line tools do, instead of failing to print.
    #[cfg(unix)]
    // SAFETY: restoring the default action of a signal, before any thread
    // is started, has no other effect.
    unsafe {
        libc::signal(libc::SIGPIPE, libc::SIG_DFL);
    }
    let cli = Cli::parse();
    match cli.command {
        Command::Check {
            paths,
            format,
            deny,
        } => check::run(&paths, format, deny == Some(Deny::Warnings)),
        Command::Fmt { paths, check } => fmt::run(&paths, check),
        Command::Fix {
            paths,
            review,
            diff,
        } => fix::run(&paths, review, diff),
        Command::Eval { file, set, format } => eval::run(&file, &set, format),
        Command::Minimize {
            file,
            signals,
            form,
            format,
        } => minimize::run(&file, &signals, form, format),
        Command::Table {
            file,
            signals,
            format,
            max_rows,
        } => table::run(&file, &signals, format, max_rows),
        Command::Export {
            file,
            to,
            as_written,
            name,
            output,
        } => export::run(&file, to, as_written, name.as_deref(), output.as_deref()),
        Command::Refactor {
            file,
            at,
            apply,
            diff,
        } => refactor::run(
            &file,
            &at,
            match &apply {
                Some(kind) => refactor::Action::Apply { kind, diff },
                None => refactor::Action::List,
            },
        ),
        Command::Rules => {
            let rules = implica_analysis::rules::ALL;
            let width = rules.iter().map(|r| r.name.len()).max().unwrap_or(0);
            for r in rules {
                let severity = if implica_analysis::rules::OFF_BY_DEFAULT.contains(&r.name) {
                    "off"
                } else {
                    r.default_severity.as_str()
                };
                println!("{:width$}  {severity:7}  {}", r.name, r.summary);
            }
            ExitCode::SUCCESS
        }
        Command::Explain { rule } => match implica_analysis::rules::find(&rule) {
            Some(r) => {
                print!("{}", r.documentation());
                ExitCode::SUCCESS
            }
            None => {
                eprintln!("implica: there is no rule `{rule}`; `implica rules` lists them");
                ExitCode::from(2)
            }
        },
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
