// Writing a scan's ranked queue into a listening session (earmark/store).
#pragma once

#include "earmark/scan/scan_report.hpp"

#include <string>

namespace earmark {

struct SessionWriteSummary {
    int added = 0;     // takes new to the session
    int updated = 0;   // takes already there (matched by audio file), suspects replaced
    int skipped = 0;   // failed rows (unreadable audio cannot join a queue)
};

// Creates the session if it does not exist (a file, or the schema in an
// empty database on a server), else opens it. Several scans may write into
// one session at once (shards on several nodes): when two create it at the
// same moment, the second writes into the session the first made. Adds every
// measured take not yet in it (matched by the audio file's canonical path),
// replaces each scanned take's suspects, and puts the scanned takes at the
// front of the queue in ranking order (other takes keep their order behind
// them) — all in one transaction, so the session holds the old state or
// the new one, never a mix. A new session file is made whole (see
// Session::createWhole): killed or failed, no file is left. `items` supply
// the script line per id (may be empty). Suspects read back from a CSV report
// without values are stored with value and threshold 0 and the whole take as
// span. Throws the session's errors (InputError, ParamError, WriteError).
SessionWriteSummary writeScanSession(const std::string& sessionPath, const ScanReport& report,
                                     const std::vector<ScanItem>& items = {});

}  // namespace earmark
