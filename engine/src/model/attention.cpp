#include "earmark/model/attention.hpp"

#include "array2d.hpp"
#include "earmark/model/array_layout.hpp"
#include "earmark/io/text_file.hpp"
#include "io/json_text.hpp"

#include <nlohmann/json.hpp>

#include <cerrno>
#include <cstring>
#include <fstream>
#include <sstream>

namespace earmark {

const char* attentionLayoutName(AttentionLayout layout) {
    switch (layout) {
    case AttentionLayout::Auto: return "auto";
    case AttentionLayout::FramesByTokens: return "frames-tokens";
    case AttentionLayout::TokensByFrames: return "tokens-frames";
    }
    return "auto";
}

AttentionMatrix readAttentionNpy(const std::string& path, int tokenCount, AttentionLayout layout) {
    detail::Array2d a = detail::squeezeTo2d(readNpy(path), path, "an attention matrix");
    const std::string shape = detail::shapeText(a.rows, a.cols);
    const std::string n = std::to_string(tokenCount);
    if (layout == AttentionLayout::Auto) {
        if (a.rows == tokenCount && a.cols == tokenCount)
            throw AmbiguousLayout(path, "shape " + shape + " has " + n +
                                            " on both axes, the number of tokens, so it may be frames × tokens or "
                                            "tokens × frames");
        if (a.rows != tokenCount && a.cols != tokenCount)
            throw InputError(path, "shape " + shape + " has no axis of " + n + " entries, one per token");
        layout = a.cols == tokenCount ? AttentionLayout::FramesByTokens : AttentionLayout::TokensByFrames;
    }
    const int tokenAxis = layout == AttentionLayout::FramesByTokens ? a.cols : a.rows;
    if (tokenAxis != tokenCount)
        throw InputError(path, "shape " + shape + " read as " + attentionLayoutName(layout) + " has " +
                                   std::to_string(tokenAxis) + " tokens, the token list " + n);
    AttentionMatrix m;
    m.tokens = tokenCount;
    m.frames = layout == AttentionLayout::FramesByTokens ? a.rows : a.cols;
    m.weights =
        layout == AttentionLayout::FramesByTokens ? std::move(a.values) : detail::transposed(a.values, a.rows, a.cols);
    return m;
}

std::vector<std::string> readTokenList(const std::string& path) {
    const std::string text = withoutByteOrderMark(readTextFile(path));
    std::vector<std::string> tokens;
    const auto firstChar = text.find_first_not_of(" \t\r\n");
    if (firstChar != std::string::npos && text[firstChar] == '[') {
        const auto j = io_detail::parseJsonText<nlohmann::json>(text, path);
        if (!j.is_array()) throw InputError(path, "is not a JSON list of tokens");
        for (std::size_t i = 0; i < j.size(); ++i) {
            if (!j[i].is_string()) throw InputError(path, "token " + std::to_string(i) + " is not a string");
            tokens.push_back(j[i].get<std::string>());
        }
    } else {
        std::size_t start = 0;
        while (start < text.size()) {
            std::size_t end = text.find('\n', start);
            if (end == std::string::npos) end = text.size();
            std::string line = text.substr(start, end - start);
            if (!line.empty() && line.back() == '\r') line.pop_back();
            tokens.push_back(std::move(line));
            start = end + 1;
        }
    }
    if (tokens.empty()) throw InputError(path, "holds no tokens");
    return tokens;
}

}  // namespace earmark
