// Exit codes shared by every earmark-cli subcommand.
#pragma once

namespace earmark::cli {

enum ExitCode : int {
    kExitOk = 0,
    kExitFailure = 1,     // an unexpected internal failure (still one clear line on stderr)
    kExitUsage = 2,       // bad command line: unknown option, missing value, bad number
    kExitBadInput = 3,    // a file that cannot be read or analysed
    kExitCannotWrite = 4, // an output or session could not be written (disk full, read-only, locked)
    kExitCancelled = 130, // stopped by Ctrl-C (128 + SIGINT, the shell convention)
};

}  // namespace earmark::cli
