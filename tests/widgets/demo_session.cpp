#include "demo_session.hpp"

#include <filesystem>

namespace earmark::test {

DemoSession::DemoSession() {
    namespace fs = std::filesystem;
    const fs::path samples = fs::path(EARMARK_SOURCE_DIR) / "samples";
    fs::copy_file(samples / "demo.earmark", dir.path() / "demo.earmark");
    fs::copy(samples / "takes", dir.path() / "takes", fs::copy_options::recursive);
    path = QString::fromStdString((dir.path() / "demo.earmark").string());
}

}  // namespace earmark::test
