"""The scalar checks of the load stage that need no catalogue (factsheet.load.scalars)."""

import subprocess
import sys

from factsheet.load import scalars


def test_cosmology_names_are_astropys_realisations():
    # astropy.cosmology.realizations.available is the reference list; reading the names from
    # the data files astropy ships must give the same set
    from astropy.cosmology import realizations

    assert set(scalars.cosmology_names()) == set(realizations.available)


def test_checking_a_cosmology_name_does_not_import_astropy_cosmology():
    code = (
        "import sys\n"
        "from factsheet.load import scalars\n"
        "assert scalars.cosmology('WMAP9', None) == 'WMAP9'\n"
        "print('astropy.cosmology' in sys.modules, 'scipy' in sys.modules)\n"
    )
    done = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, check=True)
    assert done.stdout.split() == ["False", "False"]
