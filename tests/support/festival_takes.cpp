#include "support/festival_takes.hpp"

#include <algorithm>
#include <cstdlib>
#include <fstream>
#include <stdexcept>

namespace earmark::test {
namespace fs = std::filesystem;

const fs::path& festivalTakes() {
    static const fs::path dir = [] {
        const fs::path d = fs::path(EARMARK_SOURCE_DIR) / "build" / "festival-takes";
        fs::create_directories(d.parent_path());
        const std::string script = std::string(EARMARK_TEST_DATA_DIR) + "/evidence/render_festival_takes.py";
        const std::string cmd = "flock '" + d.string() + ".lock' sh -c \"[ -f '" + d.string() + "/done' ] || (python3 '" +
                                script + "' '" + d.string() + "' && touch '" + d.string() + "/done')\"";
        if (std::system(cmd.c_str()) != 0) throw std::runtime_error("rendering the festival takes failed: " + cmd);
        return d;
    }();
    return dir;
}

std::vector<fs::path> festivalTakeFiles(const std::string& prefix, bool faults) {
    std::vector<fs::path> out;
    for (const auto& e : fs::directory_iterator(festivalTakes())) {
        const std::string name = e.path().filename().string();
        if (e.path().extension() != ".wav" || name.rfind(prefix, 0) != 0) continue;
        if ((name.find("-fault-") != std::string::npos) == faults) out.push_back(e.path());
    }
    std::sort(out.begin(), out.end());
    return out;
}

std::string firstLine(const fs::path& path) {
    std::ifstream in(path);
    std::string s;
    std::getline(in, s);
    return s;
}

}  // namespace earmark::test
