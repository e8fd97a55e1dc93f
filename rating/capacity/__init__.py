"""Member and pin resistances after section loss; every provision cited in its docstring."""
