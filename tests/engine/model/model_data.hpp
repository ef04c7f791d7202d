// Loads the numpy reference data written by tests/data/model/make_model_data.py
// (used by the compare and model tests).
#pragma once

#include <nlohmann/json.hpp>

#include <fstream>
#include <string>

namespace earmark::test {

inline std::string modelDataPath(const std::string& name) {
    return std::string(EARMARK_TEST_DATA_DIR) + "/model/" + name;
}

inline nlohmann::json modelReference() {
    std::ifstream in(modelDataPath("reference.json"));
    return nlohmann::json::parse(in);
}

}  // namespace earmark::test
