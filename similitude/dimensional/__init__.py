"""dimensional"""
