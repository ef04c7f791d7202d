// Parsing JSON text with errors that name the file (internal to the engine's
// readers). Every nlohmann exception becomes one InputError: a syntax error
// with its line and column, a number beyond a double (1e400, a 400-digit
// integer) with the number, so no reader lets a library error escape.
#pragma once

#include "earmark/core/error.hpp"
#include "earmark/marks/utf8.hpp"

#include <cstddef>
#include <set>
#include <string>
#include <string_view>
#include <vector>

namespace earmark::io_detail {

// 1-based line and column (in bytes) of a byte offset, for messages.
std::string lineAndColumn(std::string_view text, std::size_t byteOffset);

std::string hexBytes(std::string_view bytes);
std::string bytesFromHex(std::string_view hex, const std::string& source);

// The number nlohmann names in an overflow message, shortened for one line.
std::string overflowingNumber(const std::string& what);

// A path (or a name made from one) in JSON: UTF-8 text under `key`, each
// byte that is not UTF-8 shown as U+FFFD; when there were such bytes, the
// exact bytes also go under key + "_bytes" as lowercase hex, so the name
// round-trips. Read back with pathFromJson.
template <class Json>
void putPath(Json& object, const std::string& key, const std::string& path) {
    object[key] = validUtf8(path);
    if (!isValidUtf8(path)) object[key + "_bytes"] = hexBytes(path);
}

// The path putPath wrote (throws InputError(source, …) for bad hex).
template <class Json>
std::string pathFromJson(const Json& object, const std::string& key, const std::string& source) {
    if (const auto bytes = object.find(key + "_bytes"); bytes != object.end() && bytes->is_string())
        return bytesFromHex(bytes->template get<std::string>(), source);
    return object.at(key).template get<std::string>();
}

// `Json` is nlohmann::json or nlohmann::ordered_json. A key given twice in
// one object is refused (nlohmann would keep the last one silently, so a
// timings file with two "words" tiers would lose one without a word).
template <class Json>
Json parseJsonText(std::string_view text, const std::string& source) {
    std::vector<std::set<std::string>> keysOfOpenObjects;
    const auto refuseRepeatedKeys = [&](int, typename Json::parse_event_t event, Json& parsed) {
        using Event = typename Json::parse_event_t;
        if (event == Event::object_start) keysOfOpenObjects.emplace_back();
        else if (event == Event::object_end && !keysOfOpenObjects.empty()) keysOfOpenObjects.pop_back();
        else if (event == Event::key && !keysOfOpenObjects.empty() &&
                 !keysOfOpenObjects.back().insert(parsed.template get<std::string>()).second)
            throw InputError(source, "holds the key \"" + validUtf8(parsed.template get<std::string>()) +
                                         "\" twice in one object");
        return true;
    };
    try {
        return Json::parse(text.begin(), text.end(), refuseRepeatedKeys);
    } catch (const typename Json::parse_error& e) {
        throw InputError(source, lineAndColumn(text, e.byte > 0 ? e.byte - 1 : 0) + ": not valid JSON");
    } catch (const typename Json::out_of_range& e) {
        throw InputError(source, "holds a number too large to read: " + overflowingNumber(e.what()));
    } catch (const typename Json::exception&) {
        throw InputError(source, "not valid JSON");
    }
}

}  // namespace earmark::io_detail
