// A private copy of samples/demo.earmark (with its audio), so tests may
// change it without touching samples/.
#pragma once

#include "support/temp_dir.hpp"

#include <QString>

namespace earmark::test {

struct DemoSession {
    DemoSession();
    earmark::test::TempDir dir;
    QString path;  // the copied .earmark file
};

}  // namespace earmark::test
