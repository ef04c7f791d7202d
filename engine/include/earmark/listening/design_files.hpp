// Making a test design from takes (a session's builds, or one folder per
// system), and the design as JSON (how the store and the command line keep
// it; docs/listening-tests.md).
//
// Errors: InputError naming the folder or the design for a line missing in
// some system (unless incomplete lines are dropped, which is then reported in
// `notes`), an empty folder, or JSON that is not a design.
#pragma once

#include "earmark/listening/test_design.hpp"

#include <string>
#include <vector>

namespace earmark::listening {

struct SourceTake {
    std::string system;  // build tag or folder's system name
    std::string line;    // line id
    std::string text;
    std::string audio;
};

struct DesignDraft {
    TestDesign design;
    std::vector<std::string> notes;  // lines dropped, and why
};

// Systems in order of first appearance; lines sorted by id. A line that some
// system lacks is an error naming the line and the system, or (dropIncomplete)
// left out with a note. Roles of systems not named in `roles` are Candidate.
DesignDraft designFromTakes(const std::string& name, TestKind kind, const std::vector<SourceTake>& takes,
                            const std::vector<std::pair<std::string, SystemRole>>& roles, bool dropIncomplete,
                            const std::string& subject);

// One folder per system: the system is named by the folder's own name (or
// "name=folder"); its audio files (wav, flac, ogg, aiff, aif) are takes whose
// line id is the file's name without extension.
std::vector<SourceTake> takesFromFolders(const std::vector<std::string>& folderSpecs);

std::string designToJson(const TestDesign& design);
TestDesign designFromJson(const std::string& json, const std::string& subject);

}  // namespace earmark::listening
