#include "json_document.hpp"

#include "earmark/core/error.hpp"
#include "io/json_text.hpp"
#include "text_util.hpp"

namespace earmark::tiers_detail {

Json parseJsonObject(std::string_view text, const std::string& source, const std::string& notAnObject) {
    Json doc = io_detail::parseJsonText<Json>(stripBom(text), source);
    if (!doc.is_object()) throw InputError(source, notAnObject);
    return doc;
}

}  // namespace earmark::tiers_detail
