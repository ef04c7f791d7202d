// .npy reading and writing per NEP 1 ("A simple file format for NumPy
// arrays"), checked on files numpy 1.24 wrote itself
// (tests/data/make_reference_data.py) and, where /usr/bin/python3 with numpy
// is present, by numpy loading what we write.
#include "earmark/core/error.hpp"
#include "earmark/export/npy.hpp"
#include "support/temp_dir.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <iterator>
#include <limits>

namespace earmark {
namespace {

std::string npyData(const std::string& name) { return std::string(EARMARK_TEST_DATA_DIR) + "/npy/" + name; }

std::vector<char> fileBytes(const std::string& path) {
    std::ifstream in(path, std::ios::binary);
    return {std::istreambuf_iterator<char>(in), std::istreambuf_iterator<char>()};
}

// The generator's ramp: value k·0.25 − 2 at C-order position k.
void expectRamp(const NpyArray& a, const std::vector<std::int64_t>& shape) {
    EXPECT_EQ(a.shape, shape);
    std::size_t count = 1;
    for (auto d : shape) count *= static_cast<std::size_t>(d);
    ASSERT_EQ(a.data.size(), count);
    for (std::size_t k = 0; k < count; ++k) EXPECT_EQ(a.data[k], static_cast<float>(k) * 0.25f - 2.0f) << k;
}

TEST(NpyRead, FilesWrittenByNumpy) {
    struct Case {
        const char* file;
        const char* dtype;
        std::vector<std::int64_t> shape;
    };
    const Case cases[] = {
        {"f2_le_1d.npy", "<f2", {7}},          {"f4_le_2d.npy", "<f4", {3, 4}},
        {"f8_le_3d.npy", "<f8", {2, 3, 4}},    {"f4_be_2d.npy", ">f4", {4, 3}},
        {"f8_be_1d.npy", ">f8", {5}},          {"f2_be_3d.npy", ">f2", {2, 2, 3}},
        {"f4_scalar.npy", "<f4", {}},          {"f4_empty.npy", "<f4", {0, 5}},
        {"f4_v2.npy", "<f4", {2, 5}},          {"f4_v3.npy", "<f4", {2, 5}},
        {"f4_align16.npy", "<f4", {6}},
    };
    for (const Case& c : cases) {
        SCOPED_TRACE(c.file);
        const NpyArray a = readNpy(npyData(c.file));
        EXPECT_EQ(a.dtype, c.dtype);
        expectRamp(a, c.shape);
    }
}

TEST(NpyRead, HalfPrecisionSpecialValues) {
    const NpyArray a = readNpy(npyData("f2_special.npy"));
    ASSERT_EQ(a.data.size(), 6u);
    EXPECT_EQ(a.data[0], std::numeric_limits<float>::infinity());
    EXPECT_EQ(a.data[1], -std::numeric_limits<float>::infinity());
    EXPECT_TRUE(std::isnan(a.data[2]));
    EXPECT_EQ(a.data[3], std::ldexp(1.0f, -24));  // smallest subnormal half (IEEE 754 binary16)
    EXPECT_EQ(a.data[4], 65504.0f);               // largest finite half
    EXPECT_EQ(a.data[5], 0.0f);
    EXPECT_TRUE(std::signbit(a.data[5]));
}

void expectInputError(const std::string& file, const std::string& words) {
    const std::string path = npyData(file);
    try {
        readNpy(path);
        ADD_FAILURE() << "no error for " << file;
    } catch (const InputError& e) {
        EXPECT_EQ(e.subject(), path);
        EXPECT_NE(std::string(e.what()).find(words), std::string::npos) << e.what();
    }
}

TEST(NpyRead, RefusesWhatItCannotRepresent) {
    expectInputError("bad_fortran.npy", "Fortran-order");
    expectInputError("bad_int32.npy", "unsupported dtype '<i4'");
    expectInputError("bad_object.npy", "unsupported dtype '|O'");
    expectInputError("bad_structured.npy", "unsupported dtype");
    expectInputError("bad_truncated.npy", "truncated data");
    expectInputError("bad_magic.npy", "not a .npy file");
    expectInputError("bad_header_no_shape.npy", "missing 'shape'");
    expectInputError("bad_header_syntax.npy", "malformed .npy header");
    expectInputError("no_such_file.npy", "cannot open");
}

TEST(NpyRead, RefusesHandMadeBrokenHeaders) {
    test::TempDir dir;
    auto write = [&](const std::string& name, const std::string& bytes) {
        std::ofstream(dir.file(name), std::ios::binary) << bytes;
        return dir.file(name);
    };
    auto header = [](int major, const std::string& dict) {
        std::string h = dict + "\n";
        std::string out = std::string("\x93NUMPY", 6) + static_cast<char>(major) + '\0';
        out += static_cast<char>(h.size() & 0xFF);
        out += static_cast<char>(h.size() >> 8);
        return out + h;
    };
    const std::pair<std::string, std::string> cases[] = {
        {header(4, "{'descr': '<f4', 'fortran_order': False, 'shape': (1,), }"), "version 4.0"},
        {header(1, "{'descr': '<f4', 'fortran_order': False, 'shape': (-1,), }"), "negative dimension"},
        {header(1, "{'descr': '<f4', 'fortran_order': False, 'shape': (3), }"), "must be a tuple"},
        {header(1, "{'descr': '<f4', 'fortran_order': 0, 'shape': (1,), }"), "'fortran_order'"},
        {header(1, "{'descr': '<f4', 'fortran_order': False, 'shape': (1,), 'x': 1, }"), "unexpected key 'x'"},
        {header(1, "{'descr': '<f4', 'descr': '<f4', 'fortran_order': False, 'shape': (1,), }"), "twice"},
        {header(1, "['descr', '<f4']"), "expected '{'"},
        {header(1, "{'descr': '<f16', 'fortran_order': False, 'shape': (1,), }"), "unsupported dtype '<f16'"},
        {std::string("\x93NUMPY\x01\x00\x40\x00", 10), "truncated .npy header"},
    };
    int i = 0;
    for (const auto& [bytes, words] : cases) {
        const std::string path = write(std::to_string(i++) + "_case.npy", bytes);
        try {
            readNpy(path);
            ADD_FAILURE() << "no error for " << words;
        } catch (const InputError& e) {
            EXPECT_EQ(e.subject(), path);
            EXPECT_NE(std::string(e.what()).find(words), std::string::npos) << e.what();
        }
    }
}

TEST(NpyWrite, RoundTripsShapesAndAlignsDataTo64Bytes) {
    test::TempDir dir;
    const std::vector<std::vector<std::int64_t>> shapes = {{}, {5}, {3, 4}, {2, 3, 4}, {0, 7}};
    int i = 0;
    for (const auto& shape : shapes) {
        std::size_t count = 1;
        for (auto d : shape) count *= static_cast<std::size_t>(d);
        std::vector<float> data(count);
        for (std::size_t k = 0; k < count; ++k) data[k] = std::sin(static_cast<float>(k)) * 1e3f;
        const std::string path = dir.file(std::to_string(i++) + "_round_trip.npy");
        writeNpyFloat32(path, data, shape);
        const NpyArray back = readNpy(path);
        EXPECT_EQ(back.shape, shape);
        EXPECT_EQ(back.dtype, "<f4");
        EXPECT_EQ(back.data, data);
        // NEP 1 layout: magic, version 1.0, 2-byte header length, data start aligned.
        const std::vector<char> bytes = fileBytes(path);
        ASSERT_GE(bytes.size(), 10u);
        EXPECT_EQ(std::string(bytes.begin(), bytes.begin() + 6), std::string("\x93NUMPY", 6));
        EXPECT_EQ(bytes[6], 1);
        EXPECT_EQ(bytes[7], 0);
        const std::size_t headerLen = static_cast<unsigned char>(bytes[8]) | static_cast<unsigned char>(bytes[9]) << 8;
        EXPECT_EQ((10 + headerLen) % 64, 0u);
        EXPECT_EQ(bytes[9 + headerLen], '\n');
        EXPECT_EQ(bytes.size(), 10 + headerLen + 4 * count);
    }
}

TEST(NpyWrite, ErrorsNameTheShapeOrThePath) {
    test::TempDir dir;
    EXPECT_THROW(writeNpyFloat32(dir.file("x.npy"), {1, 2, 3}, {2, 2}), ParamError);
    EXPECT_THROW(writeNpyFloat32(dir.file("x.npy"), {}, {-1}), ParamError);
    const std::string bad = dir.file("missing/dir/x.npy");
    try {
        writeNpyFloat32(bad, {1.0f}, {1});
        ADD_FAILURE() << "no error";
    } catch (const Error& e) {
        EXPECT_EQ(e.subject(), bad);
    }
}

TEST(NpyWrite, NumpyLoadsWhatWeWrite) {
    const char* python = "/usr/bin/python3";
    if (!std::filesystem::exists(python) || std::system("/usr/bin/python3 -c 'import numpy' 2>/dev/null") != 0)
        GTEST_SKIP() << "no /usr/bin/python3 with numpy";
    test::TempDir dir;
    const std::string path = dir.file("ours.npy");
    std::vector<float> data(24);
    for (std::size_t k = 0; k < data.size(); ++k) data[k] = static_cast<float>(k) * 0.25f - 2.0f;
    writeNpyFloat32(path, data, {2, 3, 4});
    const std::string check =
        std::string(python) + " -c \"import numpy as np, sys; a = np.load(sys.argv[1]); "
        "sys.exit(0 if a.dtype == np.dtype('<f4') and a.shape == (2, 3, 4) and "
        "(a == (np.arange(24) * 0.25 - 2).reshape(2, 3, 4)).all() else 1)\" '" + path + "'";
    EXPECT_EQ(std::system(check.c_str()), 0);
}

}  // namespace
}  // namespace earmark
