"""kneeboard's benchmark: start-up, one card, the preview and fleets, each beside a floor measured in the same run."""
