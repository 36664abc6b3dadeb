from kneeboard.cli import main_exit

main_exit()
