// NumPy .npy files, written and read per the published format description
// (NumPy Enhancement Proposal 1, "A simple file format for NumPy arrays").
#pragma once

#include <cstdint>
#include <string>
#include <vector>

namespace earmark {

// Writes a C-order float32 array (little-endian '<f4') of the given shape.
// data.size() must equal the product of shape. Throws Error naming the path.
void writeNpyFloat32(const std::string& path, const std::vector<float>& data,
                     const std::vector<std::int64_t>& shape);

struct NpyArray {
    std::vector<std::int64_t> shape;
    std::vector<float> data;  // converted to float32, C order
    std::string dtype;        // as stored, e.g. "<f4", "<f2", "<f8"
};

// Reads float16/32/64 arrays (either endianness), versions 1.0–3.0.
// A malformed header, an unsupported dtype, Fortran order or truncated data
// throws InputError naming the path and the problem.
NpyArray readNpy(const std::string& path);

}  // namespace earmark
