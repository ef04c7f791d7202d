// A small JSON Schema (draft 2020-12) validator for the keywords Earmark's
// committed schemas use, so tests can check documents against them without a
// third-party validator. Keywords follow "JSON Schema Validation" 2020-12
// (sections 6.1-6.5) and "JSON Schema Core" 2020-12 ($ref, $defs).
// unknownKeywords() lists anything else a schema uses, so a test can fail
// when a schema grows past what this validator checks.
#pragma once

#include <nlohmann/json.hpp>

#include <regex>
#include <set>
#include <string>
#include <vector>

namespace earmark::test {

class SchemaSubset {
public:
    explicit SchemaSubset(nlohmann::json root) : root_(std::move(root)) {}

    // Every keyword used anywhere in the schema that this validator does not implement.
    std::vector<std::string> unknownKeywords() const {
        std::vector<std::string> out;
        collectUnknown(root_, "#", out);
        return out;
    }

    // Empty when the document conforms; else one line per violation, with its JSON pointer.
    std::vector<std::string> validate(const nlohmann::json& doc) const {
        std::vector<std::string> errors;
        check(root_, doc, "", errors);
        return errors;
    }

private:
    static const std::set<std::string>& known() {
        static const std::set<std::string> k = {
            "$schema", "$id", "title", "description", "$defs", "$ref", "type", "enum", "const", "required",
            "properties", "additionalProperties", "propertyNames", "items", "minimum", "exclusiveMinimum",
            "minLength", "pattern"};
        return k;
    }

    void collectUnknown(const nlohmann::json& s, const std::string& at, std::vector<std::string>& out) const {
        if (!s.is_object()) return;
        for (const auto& [key, value] : s.items()) {
            if (!known().count(key)) out.push_back(at + "/" + key);
            if (key == "properties" || key == "$defs")
                for (const auto& [name, sub] : value.items()) collectUnknown(sub, at + "/" + key + "/" + name, out);
            if (key == "items" || key == "additionalProperties" || key == "propertyNames")
                collectUnknown(value, at + "/" + key, out);
        }
    }

    const nlohmann::json& resolve(const std::string& ref) const {
        // Only local references of the form "#/$defs/name".
        const std::string prefix = "#/$defs/";
        if (ref.rfind(prefix, 0) != 0) throw std::runtime_error("unsupported $ref " + ref);
        return root_.at("$defs").at(ref.substr(prefix.size()));
    }

    static bool hasType(const nlohmann::json& v, const std::string& type) {
        if (type == "object") return v.is_object();
        if (type == "array") return v.is_array();
        if (type == "string") return v.is_string();
        if (type == "integer") return v.is_number_integer();
        if (type == "number") return v.is_number();
        if (type == "boolean") return v.is_boolean();
        if (type == "null") return v.is_null();
        return false;
    }

    void check(const nlohmann::json& s, const nlohmann::json& v, const std::string& at,
               std::vector<std::string>& errors) const {
        auto fail = [&](const std::string& why) { errors.push_back((at.empty() ? "/" : at) + ": " + why); };
        if (s.is_boolean()) {
            if (!s.get<bool>()) fail("not allowed");
            return;
        }
        if (s.contains("$ref")) check(resolve(s["$ref"]), v, at, errors);
        if (s.contains("type")) {
            bool ok = false;
            if (s["type"].is_array()) {
                for (const auto& t : s["type"]) ok = ok || hasType(v, t);
            } else {
                ok = hasType(v, s["type"]);
            }
            if (!ok) return fail("expected type " + s["type"].dump() + ", got " + v.dump());
        }
        if (s.contains("enum")) {
            bool found = false;
            for (const auto& e : s["enum"]) found = found || e == v;
            if (!found) fail("not in enum: " + v.dump());
        }
        if (s.contains("const") && s["const"] != v) fail("expected " + s["const"].dump());
        if (v.is_number()) {
            const double x = v.get<double>();
            if (s.contains("minimum") && x < s["minimum"].get<double>()) fail("below minimum");
            if (s.contains("exclusiveMinimum") && x <= s["exclusiveMinimum"].get<double>()) fail("not above exclusiveMinimum");
        }
        if (v.is_string()) {
            const std::string str = v.get<std::string>();
            if (s.contains("minLength") && str.size() < s["minLength"].get<std::size_t>()) fail("too short");
            if (s.contains("pattern") && !std::regex_search(str, std::regex(s["pattern"].get<std::string>())))
                fail("does not match " + s["pattern"].get<std::string>() + ": " + v.dump());
        }
        if (v.is_array() && s.contains("items"))
            for (std::size_t i = 0; i < v.size(); ++i) check(s["items"], v[i], at + "/" + std::to_string(i), errors);
        if (v.is_object()) {
            if (s.contains("required"))
                for (const auto& r : s["required"])
                    if (!v.contains(r.get<std::string>())) fail("missing required " + r.get<std::string>());
            for (const auto& [key, value] : v.items()) {
                const std::string child = at + "/" + key;
                if (s.contains("propertyNames")) check(s["propertyNames"], key, child + " (name)", errors);
                if (s.contains("properties") && s["properties"].contains(key)) {
                    check(s["properties"][key], value, child, errors);
                } else if (s.contains("additionalProperties")) {
                    check(s["additionalProperties"], value, child, errors);
                }
            }
        }
    }

    nlohmann::json root_;
};

}  // namespace earmark::test
