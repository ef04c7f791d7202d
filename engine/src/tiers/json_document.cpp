#include "json_document.hpp"

#include "earmark/core/error.hpp"
#include "text_util.hpp"

namespace earmark::tiers_detail {

Json parseJsonObject(std::string_view text, const std::string& source, const std::string& notAnObject) {
    text = stripBom(text);
    Json doc;
    try {
        doc = Json::parse(text.begin(), text.end());
    } catch (const Json::parse_error& e) {
        const TextPosition at = positionOf(text, e.byte > 0 ? e.byte - 1 : 0);
        throw InputError(source, "line " + std::to_string(at.line) + ", column " + std::to_string(at.column) +
                                     ": not valid JSON");
    }
    if (!doc.is_object()) throw InputError(source, notAnObject);
    return doc;
}

}  // namespace earmark::tiers_detail
