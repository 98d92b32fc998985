//! `priorwright`: with no subcommand, or with `open FILE`, the desktop
//! workbench; any other subcommand runs the command line.

use std::process::ExitCode;

fn main() -> ExitCode {
    // A bug must still end in one line and exit code 2, never a trace.
    std::panic::set_hook(Box::new(|info| {
        eprintln!("error: internal error ({info}); please report it");
        std::process::exit(2);
    }));
    let args: Vec<String> = std::env::args_os()
        .map(|a| a.to_string_lossy().into_owned())
        .collect();
    #[cfg(feature = "gui")]
    if let priorwright::cli::Invocation::Window(path) = priorwright::cli::invocation(&args) {
        use priorwright::gui::{Start, run};
        if let Some(p) = &path
            && !p.is_file()
        {
            eprintln!("error: {}: no such project file", p.display());
            return ExitCode::from(2);
        }
        let start = path.map_or(Start::Example, Start::File);
        return match run(start) {
            Ok(()) => ExitCode::SUCCESS,
            Err(e) => {
                eprintln!("error: {e}");
                ExitCode::from(2)
            }
        };
    }
    let code = priorwright::cli::main_with(args, &mut std::io::stdout(), &mut std::io::stderr());
    ExitCode::from(u8::try_from(code).unwrap_or(2))
}
