"""The scalar checks of the load stage that need no catalogue (factsheet.load.scalars)."""

from helpers import loaded_after

from factsheet.load import scalars


def test_cosmology_names_are_astropys_realisations():
    # astropy.cosmology.realizations.available is the reference list; reading the names from
    # the data files astropy ships must give the same set
    from astropy.cosmology import realizations

    assert set(scalars.cosmology_names()) == set(realizations.available)


def test_checking_a_cosmology_name_does_not_import_astropy_cosmology():
    code = (
        "from factsheet.load import scalars\nassert scalars.cosmology('WMAP9', None) == 'WMAP9'\n"
    )
    assert loaded_after(code, ("astropy.cosmology", "scipy")) == ["False", "False"]
