// NumPy .npy files, written and read per the published format description
// (NumPy Enhancement Proposal 1, "A simple file format for NumPy arrays"):
// the magic string "\x93NUMPY", a two-byte version, a little-endian header
// length (2 bytes in version 1.0, 4 bytes in 2.0 and 3.0), then an ASCII
// Python-literal dict {'descr', 'fortran_order', 'shape'} padded with spaces
// and ended by '\n', then the raw array data.
//
// Free functions; each call opens its own stream, so calls on different
// paths may run concurrently.
#pragma once

#include <cstdint>
#include <string>
#include <vector>

namespace earmark {

// Writes a C-order float32 array (little-endian '<f4') of the given shape, as
// version 1.0 with the header padded so the data starts on a 64-byte boundary
// (what NumPy itself writes since 1.19; NEP 1 asks for at least 16). An empty
// shape writes a 0-d array of one element.
// Throws ParamError("writeNpyFloat32.shape") when a dimension is negative or
// data.size() is not the product of shape; Error(path, why) when the file
// cannot be created or written.
void writeNpyFloat32(const std::string& path, const std::vector<float>& data,
                     const std::vector<std::int64_t>& shape);

struct NpyArray {
    std::vector<std::int64_t> shape;
    std::vector<float> data;  // converted to float32, C order
    std::string dtype;        // as stored, e.g. "<f4", "<f2", ">f8"
};

// Reads float16/32/64 arrays (either endianness), versions 1.0–3.0, with any
// header padding. float64 values are rounded to the nearest float32.
// Throws InputError(path, why) when the file cannot be opened, is not .npy
// (bad magic, unknown version), has a malformed header (not a dict, missing
// or unexpected keys, negative dimensions), an unsupported dtype (integers,
// objects, structured types…), Fortran order, or less data than the shape needs.
NpyArray readNpy(const std::string& path);

}  // namespace earmark
