// Every case-file key, declared once: section, name, type, unit, default and help. The parser
// (io/case_file.cpp), `cladwise check --list-keys` and docs/case-format.md all come from this table.
#pragma once

#include <span>
#include <string>
#include <string_view>

namespace cladwise::io {

enum class KeyType {
  number, integer, boolean, text, number_pair, number_triple, point_list, table, number_list,
  number_or_triple
};
enum class KeyBound { any, positive, non_negative };

struct CaseKey {
  std::string_view section;     ///< "" (top level), "materials.NAME", "domain", "region", "mesh", ...
  std::string_view name;
  KeyType type;
  std::string_view unit;        ///< "µm", "deg", "" for none
  std::string_view default_text;///< "required" or the default as the user would write it
  std::string_view applies_to;  ///< region keys: shapes they belong to ("all" for every shape)
  KeyBound bound;
  std::string_view help;
};

std::span<const CaseKey> case_keys();
/// The key by section and name; nullptr when unknown.
const CaseKey* find_case_key(std::string_view section, std::string_view name);
/// Region shapes the reader knows, in documentation order.
std::span<const std::string_view> region_shapes();
/// The key reference in Markdown (the generated part of docs/case-format.md).
std::string case_key_reference_markdown();
std::string_view key_type_name(KeyType t);

}  // namespace cladwise::io
