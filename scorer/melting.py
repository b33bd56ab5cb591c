"""placeholder"""
MODEL_FEATURES = ()
