"""Used only when setuptools is the build backend (see pyproject.toml):
puts headwater_capture.pth at the top of the wheel, next to the package,
so that site.py runs it at interpreter start."""

import os

from setuptools import setup
from setuptools.command.build_py import build_py

PTH = "headwater_capture.pth"


class build_py_with_pth(build_py):
    def run(self):
        super().run()
        here = os.path.dirname(os.path.abspath(__file__))
        self.copy_file(os.path.join(here, PTH), os.path.join(self.build_lib, PTH))

    def get_outputs(self, include_bytecode=1):
        return super().get_outputs(include_bytecode) + [os.path.join(self.build_lib, PTH)]


setup(cmdclass={"build_py": build_py_with_pth})
