//! `priorwright`: subcommands run the command line; with none, the help is
//! shown (the desktop workbench takes that place once it lands).

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
    let code = priorwright::cli::main_with(args, &mut std::io::stdout(), &mut std::io::stderr());
    ExitCode::from(u8::try_from(code).unwrap_or(2))
}
