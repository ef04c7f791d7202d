# What `cmake --install` puts where (any prefix), and the Debian package that
# `cpack` builds from it: both programs, the desktop entry, the AppStream
# metadata, the icon (SVG and PNG sizes), the documentation and the demo
# samples. The programs' own install rules are in app/cli and app/gui.
include(GNUInstallDirs)

if(EARMARK_BUILD_GUI)
  install(FILES ${PROJECT_SOURCE_DIR}/resources/org.example.earmark.metainfo.xml
    DESTINATION ${CMAKE_INSTALL_DATADIR}/metainfo)
  foreach(size 16 24 32 48 64 128 256)
    install(FILES ${PROJECT_SOURCE_DIR}/resources/icons/earmark-${size}.png
      DESTINATION ${CMAKE_INSTALL_DATADIR}/icons/hicolor/${size}x${size}/apps RENAME earmark.png)
  endforeach()
endif()
install(FILES ${PROJECT_SOURCE_DIR}/README.md ${PROJECT_SOURCE_DIR}/LICENSE
  DESTINATION ${CMAKE_INSTALL_DATADIR}/doc/earmark)
install(DIRECTORY ${PROJECT_SOURCE_DIR}/docs/ DESTINATION ${CMAKE_INSTALL_DATADIR}/doc/earmark)
install(DIRECTORY ${PROJECT_SOURCE_DIR}/samples/ DESTINATION ${CMAKE_INSTALL_DATADIR}/earmark/samples
  USE_SOURCE_PERMISSIONS)

set(CPACK_GENERATOR DEB)
set(CPACK_PACKAGE_NAME earmark)
set(CPACK_PACKAGE_VENDOR "Earmark developers")
set(CPACK_PACKAGE_CONTACT "Earmark developers <earmark@example.invalid>")
set(CPACK_PACKAGE_DESCRIPTION_SUMMARY "workbench and batch scanner for synthesised speech takes")
set(CPACK_PACKAGE_DESCRIPTION
  "Earmark shows a speech take's waveform, spectrogram, pitch contour and energy\n"
  "under word- and phone-aligned tiers, plays any span, and records marked\n"
  "faults; earmark-cli measures and ranks whole test sets of synthesised speech.")
set(CPACK_RESOURCE_FILE_LICENSE ${PROJECT_SOURCE_DIR}/LICENSE)
set(CPACK_DEBIAN_FILE_NAME DEB-DEFAULT)
set(CPACK_DEBIAN_PACKAGE_SECTION sound)
# The shared libraries the programs link (Qt, libsndfile, FFTW, espeak-ng, …) become
# dependencies through dpkg-shlibdeps; the acoustic model is data, so it is named here.
set(CPACK_DEBIAN_PACKAGE_SHLIBDEPS ON)
set(CPACK_DEBIAN_PACKAGE_RECOMMENDS "pocketsphinx-en-us")
include(CPack)
